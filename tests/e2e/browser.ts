// Shared Playwright plumbing for the end-to-end tests: Debian's Chromium, a guard against requests
// to other hosts, sign-in, screenshots and the axe-core check.
import { mkdirSync } from "node:fs";
import axe from "axe-core";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { expect, inject } from "vitest";

/** The server under test, from tests/setup/e2e-global.ts. */
export const baseUrl = (): string => inject("baseUrl");

/** Launches Debian's Chromium with the flags of STACK.md (no sandbox, no background traffic). */
export function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

/** A page plus the list of every request it made to a host other than the app's own. */
export interface GuardedPage {
  context: BrowserContext;
  page: Page;
  foreign: string[];
  pageErrors: string[];
}

/** A fresh context (own cookies) whose page records off-host requests and uncaught page errors. */
export async function openPage(browser: Browser): Promise<GuardedPage> {
  // page.request (Playwright's API client, used for set-up steps) is not a browser fetch: it sends neither Origin
  // nor Sec-Fetch-Site, so the server's cross-site guard (server/http/same-origin.ts) would refuse its POSTs.
  // The page's own requests carry the same Origin anyway.
  const context = await browser.newContext({
    baseURL: baseUrl(),
    viewport: { width: 1280, height: 800 },
    extraHTTPHeaders: { Origin: new URL(baseUrl()).origin },
  });
  const page = await context.newPage();
  const origin = new URL(baseUrl()).origin;
  const foreign: string[] = [];
  const pageErrors: string[] = [];
  page.on("request", (req) => {
    const url = new URL(req.url());
    if (url.protocol === "data:" || url.protocol === "blob:") return;
    if (url.origin !== origin) foreign.push(req.url());
  });
  page.on("pageerror", (err) => pageErrors.push(err.message));
  return { context, page, foreign, pageErrors };
}

/** Signs in through the form and waits for the shell to show the user's name. */
export async function signIn(
  page: Page,
  username: string,
  password: string,
  displayName: string,
): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("User name").fill(username);
  await page.getByLabel("Password").fill(password);
  await page.getByLabel("Password").press("Enter");
  await page.getByRole("button", { name: new RegExp(displayName) }).waitFor();
}

/** Saves a full-page PNG to test-results/screenshots/<name>.png (git-ignored). */
export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync("test-results/screenshots", { recursive: true });
  // Fonts arrive as separate files: wait so the picture shows Inter, not the fallback.
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  await page.screenshot({ path: `test-results/screenshots/${name}.png`, fullPage: true });
}

interface AxeViolation {
  id: string;
  impact?: string | null;
  help: string;
  nodes: Array<{ target: unknown }>;
}

/** Runs axe-core in the page and fails on any serious or critical violation, listing them. */
export async function expectAccessible(page: Page, name: string): Promise<void> {
  const loaded = await page.evaluate(() => "axe" in window);
  // Evaluated through the DevTools protocol rather than addScriptTag: the app's CSP (script-src 'self')
  // rightly blocks an inline <script>, and the check should run with that policy still enforced.
  if (!loaded) await page.evaluate(axe.source);
  const violations = await page.evaluate(async () => {
    const w = window as unknown as { axe: { run: () => Promise<{ violations: AxeViolation[] }> } };
    const result = await w.axe.run();
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.map((n) => n.target),
    }));
  });
  const bad = violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad, `${name}: ${JSON.stringify(bad, null, 2)}`).toEqual([]);
}

/** The seeded demo accounts (development only, invented people). */
export const DEMO = {
  admin: { username: "admin", password: "tapwright-admin", displayName: "Noor Vance" },
  author: { username: "author", password: "tapwright-author", displayName: "Ilse Marrow" },
  reviewer: { username: "reviewer", password: "tapwright-reviewer", displayName: "Tomas Quill" },
  firmware: { username: "firmware", password: "tapwright-firmware", displayName: "Priya Lund" },
} as const;

/** Creates a design in the demo project `coastwatch-s` through the API, as the user signed in on `page`. */
export async function createDemoDesign(
  page: Page,
  design: { name: string; description: string; content: Record<string, unknown> },
): Promise<{ designId: number; revisionId: number }> {
  const projects = (await (await page.request.get("/api/projects")).json()) as {
    projects: Array<{ id: number; slug: string }>;
  };
  const project = projects.projects.find((x) => x.slug === "coastwatch-s");
  expect(project, "the seed has project coastwatch-s").toBeDefined();
  const res = await page.request.post(`/api/projects/${project!.id}/designs`, { data: design });
  expect(res.status(), await res.text()).toBe(201);
  const body = (await res.json()) as { design: { id: number }; revision: { id: number } };
  return { designId: body.design.id, revisionId: body.revision.id };
}
