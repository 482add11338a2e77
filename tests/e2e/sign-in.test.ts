// Each demo role signs in and sees its own home; sign-out; a wrong password; the way back after sign-in.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, launch, openPage, signIn } from "./browser";

let browser: Browser;
/** The seeded projects only: the admin journey (journeys.test.ts) adds "Harbour trial …" projects to the shared demo. */
const seeded = (names: string[]) => names.filter((n) => !n.startsWith("Harbour trial "));
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser.close();
});

describe("sign-in and the home page per role", () => {
  it("admin sees all projects, the user count, active sessions, database health and the Admin entry", async () => {
    const { page, foreign, pageErrors, context } = await openPage(browser);
    await signIn(page, DEMO.admin.username, DEMO.admin.password, DEMO.admin.displayName);
    await expect
      .poll(() => page.getByRole("heading", { level: 1 }).textContent())
      .toBe("Welcome, Noor Vance");
    const summary = page.getByRole("definition").first();
    await summary.waitFor();
    expect(await page.getByText("Active sessions").count()).toBe(1);
    expect(await page.getByText("Users", { exact: true }).count()).toBeGreaterThan(0);
    await page.getByRole("region", { name: "Server" }).waitFor();
    const table = page.getByRole("table", { name: "My projects" });
    // Seeded: both projects visible to the admin.
    expect(seeded(await table.getByRole("link").allTextContents())).toEqual([
      "Coastwatch-S surveillance radar",
      "Harbour lidar trials",
    ]);
    const nav = page.getByRole("navigation", { name: "Main" });
    expect(await nav.getByRole("link").allTextContents()).toEqual([
      "Home",
      "Projects",
      "Releases",
      "Templates",
      "Account",
      "Users",
      "Audit trail",
      "Mailbox",
    ]);
    expect(foreign).toEqual([]);
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it("author sees both of their projects, no admin figures and no Admin entry", async () => {
    const { page, foreign, context } = await openPage(browser);
    await signIn(page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
    await page.getByRole("table", { name: "My projects" }).waitFor();
    expect(await page.getByRole("table", { name: "My projects" }).getByRole("link").count()).toBe(2);
    expect(await page.getByRole("region", { name: "My roles" }).textContent()).toContain(
      "submit them for review",
    );
    expect(await page.getByText("Active sessions").count()).toBe(0);
    expect(await page.getByRole("region", { name: "Server" }).count()).toBe(0);
    const nav = page.getByRole("navigation", { name: "Main" });
    expect(await nav.getByRole("link").allTextContents()).toEqual([
      "Home",
      "Projects",
      "Releases",
      "Templates",
      "Account",
    ]);
    expect(foreign).toEqual([]);
    await context.close();
  });

  it("reviewer sees only the project they are a member of and their review duty", async () => {
    const { page, context } = await openPage(browser);
    await signIn(page, DEMO.reviewer.username, DEMO.reviewer.password, DEMO.reviewer.displayName);
    const table = page.getByRole("table", { name: "My projects" });
    await table.waitFor();
    // Membership scoping: the lidar trial has only admin and author.
    expect(seeded(await table.getByRole("link").allTextContents())).toEqual([
      "Coastwatch-S surveillance radar",
    ]);
    expect(await page.getByRole("region", { name: "My roles" }).textContent()).toContain("acceptance limits");
    expect(await page.getByText("Active sessions").count()).toBe(0);
    await context.close();
  });

  it("firmware sees its project and its download duty; /admin/users is refused", async () => {
    const { page, context } = await openPage(browser);
    await signIn(page, DEMO.firmware.username, DEMO.firmware.password, DEMO.firmware.displayName);
    const table = page.getByRole("table", { name: "My projects" });
    await table.waitFor();
    expect(seeded(await table.getByRole("link").allTextContents())).toEqual([
      "Coastwatch-S surveillance radar",
    ]);
    expect(await page.getByRole("region", { name: "My roles" }).textContent()).toContain("download bundles");
    await page.goto("/admin/users");
    await page.getByRole("heading", { name: "Not available to you" }).waitFor();
    await context.close();
  });
});

describe("session", () => {
  it("signs out from the user menu and lands on the sign-in page; the shell is then closed", async () => {
    const { page, context } = await openPage(browser);
    await signIn(page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
    await page.getByRole("button", { name: /Ilse Marrow/ }).click();
    await page.getByRole("menuitem", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in$/);
    await page.goto("/projects");
    // No session: the 401 sends the user back to sign in, remembering where they were going.
    await page.waitForURL(/\/sign-in\?next=%2Fprojects$/);
    await context.close();
  });

  it("shows the server's message for a wrong password and stays on the form", async () => {
    const { page, context } = await openPage(browser);
    await page.goto("/sign-in");
    await page.getByLabel("User name").fill("reviewer");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    const alert = page.getByRole("alert");
    await alert.waitFor();
    expect(await alert.textContent()).toBe("User name or password is incorrect");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await context.close();
  });

  it("after sign-in returns the user to the page they asked for", async () => {
    const { page, context } = await openPage(browser);
    await page.goto("/projects?q=harbour");
    await page.waitForURL(/\/sign-in\?next=/);
    await page.getByLabel("User name").fill(DEMO.admin.username);
    await page.getByLabel("Password").fill(DEMO.admin.password);
    await page.getByLabel("Password").press("Enter");
    await page.waitForURL(/\/projects\?q=harbour$/);
    const table = page.getByRole("table", { name: "Projects" });
    await table.waitFor();
    expect(seeded(await table.getByRole("link").allTextContents())).toEqual(["Harbour lidar trials"]);
    await context.close();
  });
});
