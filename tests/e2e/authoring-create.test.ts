// An author creates a design from a generator (LFM) and another from an uploaded CSV written at run time, and
// lands on each one's r1 revision page. Along the way: the designs table on the project page, the form's derived
// figures, the server's line/column refusal of a bad file, and a taken name reported next to the name field.
// Screenshots go to test-results/screenshots/; every page passes axe (no serious or critical violation).
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, expectAccessible, launch, openPage, screenshot, signIn, type GuardedPage } from "./browser";

let browser: Browser;
let author: GuardedPage;
let projectPath = "";
const dir = mkdtempSync(join(tmpdir(), "tapwright-e2e-"));
// Names unique per run, so the test does not depend on what the seed or an earlier run created.
const stamp = Date.now().toString(36);
const chirpName = `E2E chirp ${stamp}`;

beforeAll(async () => {
  browser = await launch();
  author = await openPage(browser);
  await signIn(author.page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
  await author.page.goto("/projects");
  await author.page.getByRole("link", { name: "Coastwatch-S surveillance radar" }).click();
  await author.page.waitForURL(/\/projects\/\d+$/);
  projectPath = new URL(author.page.url()).pathname;
});
afterAll(async () => {
  await browser.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("authoring: create designs", () => {
  it("project page lists designs with the author's New design action", async () => {
    const { page } = author;
    await page.goto(projectPath);
    await page.getByRole("link", { name: "New design" }).first().waitFor();
    // Either the seeded designs or the empty state, never a spinner forever.
    await page.getByRole("table", { name: "Designs" }).or(page.getByText("No designs yet")).first().waitFor();
    await screenshot(page, "authoring-project-designs");
    await expectAccessible(page, "authoring-project-designs");
  });

  it("creates a design from the LFM generator and lands on its r1", async () => {
    const { page } = author;
    await page.goto(projectPath);
    await page.getByRole("link", { name: "New design" }).first().click();
    await page.waitForURL(/\/designs\/new$/);
    await page.getByLabel("Name").fill(chirpName);
    // Derived figures of the defaults (10 MHz, 50 µs, 12.5 MHz): N = 625, BT = 500.
    const derived = page.getByRole("region", { name: "Derived figures" });
    await expect.poll(() => derived.textContent()).toContain("625");
    expect(await derived.textContent()).toContain("500");
    await page.getByLabel("Pulse width T (µs)").fill("40");
    await expect.poll(() => derived.textContent()).toContain("400"); // BT = 10 MHz × 40 µs
    await page.getByLabel("Pulse width T (µs)").fill("50");
    await screenshot(page, "authoring-new-design-generator");
    await expectAccessible(page, "authoring-new-design-generator");
    await page.getByLabel("Name").press("Enter");
    await page.waitForURL(/\/revisions\/\d+$/);
    await page.getByRole("heading", { name: new RegExp(chirpName) }).waitFor();
    await page.getByText(/Coefficient tables \(2\)/).waitFor();
  });

  it("a taken name comes back next to the name field, with everything typed kept", async () => {
    const { page } = author;
    await page.goto(`${projectPath}/designs/new`);
    await page.getByLabel("Name").fill(chirpName);
    await page.getByLabel("Bandwidth B (MHz)").fill("8");
    await page.getByRole("button", { name: "Create design" }).click();
    await page.getByText("this name is taken in the project").waitFor();
    expect(await page.getByLabel("Bandwidth B (MHz)").inputValue()).toBe("8");
    expect(page.url()).toMatch(/\/designs\/new$/);
  });

  it("refuses a bad file with its line and column, then creates a design from a good CSV", async () => {
    const { page } = author;
    await page.goto(`${projectPath}/designs/new`);
    await page.getByLabel("Name").fill(`E2E uploaded chirp ${stamp}`);
    await page.getByLabel("Upload a file").check();

    const bad = join(dir, "bad.csv");
    writeFileSync(bad, "i,q\n1,0\n0.5,abc\n");
    await page.getByLabel("Coefficient file").setInputFiles(bad);
    const alert = page.getByRole("alert").filter({ hasText: "nothing was stored" });
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/bad\.csv: line 3, column 5/);

    // 64 samples of a unit-modulus quadratic-phase pulse, I and Q columns with a header.
    const rows = Array.from({ length: 64 }, (_, n) => {
      const phi = (Math.PI * (n - 31.5) ** 2) / 64;
      return `${Math.cos(phi).toFixed(9)},${Math.sin(phi).toFixed(9)}`;
    });
    const good = join(dir, "pulse.csv");
    writeFileSync(good, `i,q\n${rows.join("\n")}\n`);
    await page.getByLabel("Coefficient file").setInputFiles(good);
    const meta = page.getByRole("definition").filter({ hasText: "complex" });
    await meta.waitFor();
    expect(await page.getByTestId("upload-count").textContent()).toBe("64 complex (I, Q)");
    await page.getByLabel("Sample rate fs (MHz)").fill("10");
    await screenshot(page, "authoring-new-design-upload");
    await expectAccessible(page, "authoring-new-design-upload");
    await page.getByRole("button", { name: "Create design" }).click();
    await page.waitForURL(/\/revisions\/\d+$/);
    await page.getByText(/Coefficient tables \(2\)/).waitFor();
  });

  it("the new designs appear in the table; search and filter live in the URL", async () => {
    const { page } = author;
    await page.goto(projectPath);
    const table = page.getByRole("table", { name: "Designs" });
    await table.waitFor();
    await page.keyboard.press("/");
    expect(await page.evaluate(() => document.activeElement?.id)).toBe("design-search");
    await page.keyboard.type(stamp);
    await page.waitForURL(new RegExp(`q=${stamp}`));
    expect((await table.getByRole("link").allTextContents()).sort()).toEqual(
      [chirpName, `E2E uploaded chirp ${stamp}`].sort(),
    );
    await page.getByLabel("Kind").selectOption("filter");
    await page.waitForURL(/kind=filter/);
    await page.getByText("No design matches this search or filter").waitFor();
    await screenshot(page, "authoring-project-designs-no-match");
    await page.getByRole("button", { name: "Clear the search and filters" }).click();
    await table.waitFor();
    expect(new URL(page.url()).search).toBe("");
    expect(author.foreign).toEqual([]);
    expect(author.pageErrors).toEqual([]);
  });
});
