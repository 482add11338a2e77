// The four journeys, walked as each role would at 1440×900. Author: the new-design form refuses a typo by name,
// shows the server's refusal (fs below B) at the sample-rate field, creates the design, runs the analysis (which
// sweeps the word length by default), uses the recommended W, runs it again and submits. Reviewer: the queue,
// then approves. Firmware: the release page and the bundle download (SHA-256 checked). Admin: creates a project
// and adds a member. Screenshots to test-results/screenshots/journey-*.png; axe on every page shown.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, expectAccessible, launch, openPage, screenshot, signIn, type GuardedPage } from "./browser";

let browser: Browser;
const stamp = Date.now().toString(36);
const DESIGN = `E2E journey chirp ${stamp}`;
let revisionId = 0;
let releaseId = 0;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser.close();
});

async function as(role: keyof typeof DEMO): Promise<GuardedPage> {
  const g = await openPage(browser);
  await g.page.setViewportSize({ width: 1440, height: 900 });
  const u = DEMO[role];
  await signIn(g.page, u.username, u.password, u.displayName);
  return g;
}

async function shot(page: Page, name: string): Promise<void> {
  await screenshot(page, `journey-${name}`);
  await expectAccessible(page, `journey-${name}`);
}

/** Waits for the analysis of the open revision page to finish (started from the header's one action). */
async function runAnalysis(page: Page): Promise<void> {
  const header = page.getByRole("button", { name: "Run analysis" }).first();
  await header.waitFor();
  await header.click();
  const section = page.getByRole("region", { name: "Analysis" });
  await section.getByRole("link", { name: "Open the report" }).waitFor({ timeout: 120_000 });
}

describe("the four journeys", () => {
  it("author: a refusal at its field, create, analyse with the sweep, use the recommended W, submit", async () => {
    const author = await as("author");
    const { page } = author;
    await page.goto("/projects");
    await page.getByRole("link", { name: "Coastwatch-S surveillance radar" }).click();
    await page.getByRole("link", { name: "New design" }).first().click();
    await page.waitForURL(/\/designs\/new$/);
    await page.getByLabel("Name").fill(DESIGN);
    const chirp = page.getByRole("group", { name: "Linear FM chirp" });

    // A typo is refused by name, not read as the digits before it.
    await chirp.getByLabel("Bandwidth B (MHz)").fill("1O");
    await chirp.getByLabel("Pulse width T (µs)").focus();
    await chirp.getByText("“1O” is not a number", { exact: false }).waitFor();
    // The derived figures stay, marked as from the last valid values.
    const derived = page.getByRole("region", { name: "Derived figures" });
    await derived.getByText("From the last valid values", { exact: false }).waitFor();
    await shot(page, "author-1-typo");

    // fs below B: only the server's generator knows; its refusal lands at the sample-rate field.
    await chirp.getByLabel("Bandwidth B (MHz)").fill("1");
    await chirp.getByLabel("Pulse width T (µs)").fill("40");
    await chirp.getByLabel("Sample rate fs (MHz)").fill("0.5");
    await page.getByRole("group", { name: "Acceptance limits" }).getByLabel("PSL at most (dB)").fill("-20");
    await page
      .getByRole("group", { name: "Acceptance limits" })
      .getByLabel("Coefficient SQNR at least (dB)")
      .fill("40");
    await page.getByRole("button", { name: "Create design" }).click();
    const fs = chirp.getByLabel("Sample rate fs (MHz)");
    await chirp.getByText("fs (0.5 MHz) must be ≥ B (1 MHz) for complex output").waitFor();
    expect(await fs.getAttribute("aria-invalid")).toBe("true");
    expect(page.url()).toMatch(/\/designs\/new$/);
    await shot(page, "author-2-server-refusal-at-field");

    await fs.fill("1.25");
    await page.getByRole("button", { name: "Create design" }).click();
    await page.waitForURL(/\/revisions\/\d+$/);
    revisionId = Number(/\/revisions\/(\d+)$/.exec(page.url())![1]);
    await page.getByRole("heading", { name: new RegExp(`${DESIGN} r1`) }).waitFor();
    // A fresh draft: the header's one action is to run the analysis.
    expect(await page.getByRole("button", { name: "Submit for review" }).count()).toBe(0);
    await shot(page, "author-3-fresh-draft");

    await runAnalysis(page);
    const section = page.getByRole("region", { name: "Analysis" });
    await section.getByText("smallest passing word length", { exact: false }).waitFor();
    const use = section.getByRole("button", { name: /^Use W = \d+ for rx$/ });
    await use.waitFor();
    const w = Number(/W = (\d+)/.exec((await use.textContent())!)![1]);
    expect(w).toBeLessThan(16);

    // The report: the sweep plotted with the limits and the smallest passing W.
    await section.getByRole("link", { name: "Open the report" }).click();
    await page.getByRole("region", { name: "Bit-width sweep" }).waitFor();
    await page.getByRole("region", { name: "Bit-width sweep" }).getByText(`W = ${w}`).first().waitFor();
    await page.locator("canvas").first().waitFor();
    await shot(page, "author-4-report-sweep");
    await page.goBack();

    await page
      .getByRole("region", { name: "Analysis" })
      .getByRole("button", { name: `Use W = ${w} for rx` })
      .click();
    await page
      .getByRole("status")
      .filter({ hasText: `rx set to W = ${w}` })
      .waitFor();
    const fixed = page.getByRole("form", { name: "Fixed-point spec" });
    await expect.poll(() => fixed.getByLabel("rx word length W (bits)").inputValue()).toBe(String(w));
    await runAnalysis(page);
    // The sweep moved with the new W; whatever it recommends now is offered again or already used.
    const again = page.getByRole("region", { name: "Analysis" });
    await again
      .getByText("rx already at", { exact: false })
      .or(again.getByRole("button", { name: /^Use W = \d+ for rx$/ }))
      .first()
      .waitFor();
    await again.getByRole("form", { name: "Sweep range" }).waitFor();

    const submit = page.getByRole("button", { name: "Submit for review" });
    await submit.click();
    const dialog = page.getByRole("dialog", { name: "Submit r1 for review?" });
    await dialog.getByText("This cannot be undone").waitFor();
    await shot(page, "author-5-submit-confirm");
    await dialog.getByRole("button", { name: "Submit r1" }).click();
    await page.getByRole("status").filter({ hasText: "r1 is in review" }).waitFor();
    await author.context.close();
  }, 300_000);

  it("reviewer: finds it in the queue and approves it", async () => {
    expect(revisionId).toBeGreaterThan(0);
    const reviewer = await as("reviewer");
    const { page } = reviewer;
    await page.goto("/reviews");
    const queue = page.getByRole("table", { name: "Review queue" });
    const link = queue.getByRole("link", { name: `${DESIGN} r1` });
    await link.waitFor();
    await shot(page, "reviewer-1-queue");
    await link.click();
    // The header sends the reviewer to the decision.
    await page.getByRole("link", { name: "Review and decide" }).waitFor();
    const decision = page.getByRole("region", { name: "Review" }).getByRole("form", { name: "Decision" });
    await decision.getByLabel("Approve", { exact: true }).check();
    await decision.getByLabel("Comment").fill("Sweep and limits agree; fine for the harbour trial build.");
    await decision.getByRole("button", { name: "Record decision…" }).click();
    const confirm = page.getByRole("dialog", { name: "Approve r1?" });
    await confirm.getByText("bound to content hash", { exact: false }).waitFor();
    await confirm.getByRole("button", { name: "Approve" }).click();
    await page
      .getByRole("figure", { name: "Last review decision" })
      .getByText(/Approved by Tomas Quill/)
      .waitFor();
    await shot(page, "reviewer-2-approved");
    await reviewer.context.close();
  }, 120_000);

  it("firmware: the release page and the bundle download", async () => {
    const author = await as("author");
    const res = await author.page.request.post(`/api/revisions/${revisionId}/release`, {
      data: { version: "1.0.0", notes: "First harbour-trial build of the journey chirp." },
    });
    expect(res.status(), await res.text()).toBe(201);
    releaseId = ((await res.json()) as { release: { id: number } }).release.id;
    await author.context.close();

    const firmware = await as("firmware");
    const { page } = firmware;
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Releases" }).click();
    await page
      .getByRole("table", { name: "Releases" })
      .getByRole("link", { name: "1.0.0" })
      .first()
      .waitFor();
    await page.goto(`/releases/${releaseId}`);
    await page.getByRole("heading", { name: new RegExp(`${DESIGN} 1\\.0\\.0`) }).waitFor();
    await page.getByRole("table", { name: "Bundle files" }).getByRole("row").nth(1).waitFor();
    await shot(page, "firmware-1-release");
    const shown = (await page.getByTestId("bundle-sha256").textContent())!.trim();
    const [download] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Download bundle" }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/-1\.0\.0\.zip$/);
    // node:crypto's SHA-256 of the bytes the browser saved, against the page's figure.
    expect(
      createHash("sha256")
        .update(readFileSync((await download.path())!))
        .digest("hex"),
    ).toBe(shown);
    await firmware.context.close();
  }, 180_000);

  it("admin: creates a project and adds a member", async () => {
    const admin = await as("admin");
    const { page } = admin;
    await page.goto("/projects");
    await page.getByRole("button", { name: "New project" }).click();
    const dialog = page.getByRole("dialog", { name: "New project" });
    await dialog.getByLabel("Name").fill(`Harbour trial ${stamp}`);
    await expect.poll(() => dialog.getByLabel("Slug").inputValue()).toBe(`harbour-trial-${stamp}`);
    await dialog.getByLabel("Description").fill("Pier-mounted trial of the coastal radar (fictional).");
    await shot(page, "admin-1-new-project");
    await dialog.getByRole("button", { name: "Create project" }).click();
    await page.getByRole("heading", { name: `Harbour trial ${stamp}` }).waitFor();
    const add = page.getByLabel("Add a member");
    await expect.poll(() => add.isEnabled()).toBe(true);
    const value = await add.locator("option", { hasText: DEMO.firmware.displayName }).getAttribute("value");
    await add.selectOption(value!);
    await page.getByRole("button", { name: "Add", exact: true }).click();
    const members = page.getByRole("table", { name: "Members" });
    await members.getByRole("cell", { name: DEMO.firmware.displayName }).waitFor();
    await page.getByRole("region", { name: "Members (1)" }).waitFor();
    await shot(page, "admin-2-member-added");
    await admin.context.close();
  }, 120_000);
});
