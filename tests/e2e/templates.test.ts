// Admin opens the export templates, reads a built-in in the Monaco editor (loaded from the app itself),
// copies it as a custom template, sees a bad edit flagged at its line in the live preview, undoes it
// and saves; an author sees the list read-only; a firmware engineer has no Templates entry.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, expectAccessible, launch, openPage, screenshot, signIn } from "./browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser.close();
});

describe("export templates", () => {
  it("lets an admin copy a built-in, see an error at its line, and save a custom template", async () => {
    const admin = await openPage(browser);
    const { page } = admin;
    await signIn(page, DEMO.admin.username, DEMO.admin.password, DEMO.admin.displayName);
    await page.getByRole("link", { name: "Templates" }).click();
    const table = page.getByRole("table", { name: "Export templates" });
    await table.getByRole("link", { name: "Verilog $readmemh hex" }).waitFor();
    for (const name of [
      "CSV with exact decimals",
      "C header (stdint)",
      "VHDL-2008 package (numeric_std)",
      "JSON table",
      "Raw little-endian binary",
    ])
      await table.getByRole("link", { name }).waitFor();
    await expectAccessible(page, "templates list");
    await screenshot(page, "templates-list");

    await table.getByRole("link", { name: "Verilog $readmemh hex" }).click();
    await page.locator(".monaco-editor").waitFor({ timeout: 30_000 });
    const preview = page.getByLabel("Rendered sample");
    // The complex sample's first words, I and Q interleaved, with the // header the file carries.
    await expect
      .poll(() => preview.textContent(), { timeout: 15_000 })
      .toContain("// complex: I and Q interleaved");
    await page.getByLabel("Sample table").selectOption("real");
    await expect.poll(() => preview.textContent(), { timeout: 15_000 }).toMatch(/\n800\n/); // −2048 at W = 12
    await screenshot(page, "templates-builtin-readmemh");

    await page.getByRole("button", { name: "Copy as custom" }).click();
    await page.waitForURL(/\/templates\/new$/);
    const name = `Readmemh for the FPGA team ${Date.now().toString(36)}`;
    await page.getByLabel("Name").fill(name);
    await page.getByLabel("File extension").fill("mem");

    // A bad edit: an unknown variable at the end of the source (once the new page's editor holds the copy).
    await page
      .locator(".monaco-editor .view-lines", { hasText: "Tapwright memory file" })
      .waitFor({ timeout: 30_000 });
    // A click below the last line puts the cursor at the end of the source.
    await page.locator(".monaco-editor").click({ position: { x: 200, y: 360 } });
    await expect
      .poll(() => page.evaluate(() => Boolean(document.activeElement?.closest(".monaco-editor"))))
      .toBe(true);
    await page.keyboard.press("Control+End");
    await page.keyboard.press("Enter");
    await page.keyboard.type("{{ no_such_field ", { delay: 60 });
    const alert = page.getByRole("alert").filter({ hasText: "no_such_field" });
    await alert.waitFor({ timeout: 15_000 }).catch(async (e: unknown) => {
      await screenshot(page, "templates-failure");
      throw e;
    });
    expect(await alert.textContent()).toMatch(/Line \d+, column \d+/);
    await page.locator(".monaco-editor .squiggly-error").first().waitFor();
    await screenshot(page, "templates-error-marker");

    // Delete the bad line again (the editor may have closed the braces itself), then save: version 1.
    await page.keyboard.press("Control+End");
    await page.keyboard.press("Shift+Home");
    await page.keyboard.press("Backspace");
    await page.keyboard.press("Backspace");
    await expect
      .poll(async () => await page.getByRole("alert").filter({ hasText: "no_such_field" }).count(), {
        timeout: 15_000,
      })
      .toBe(0);
    await page.getByRole("button", { name: "Create template" }).click();
    await page.waitForURL(/\/templates\/\d+$/);
    await page.getByText(`Created “${name}” (v1)`).waitFor();
    await page.getByRole("link", { name: "Templates", exact: true }).first().click();
    const row = page.getByRole("row", { name: new RegExp(name) });
    await row.waitFor();
    expect(await row.textContent()).toContain("v1");
    expect(admin.foreign, "requests to other hosts").toEqual([]);
    expect(admin.pageErrors).toEqual([]);
  });

  it("shows authors the list read-only and hides Templates from firmware engineers", async () => {
    const author = await openPage(browser);
    await signIn(author.page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
    await author.page.goto("/templates");
    await author.page.getByRole("link", { name: "CSV with exact decimals" }).waitFor();
    expect(await author.page.getByRole("link", { name: "New template" }).count()).toBe(0);

    const firmware = await openPage(browser);
    await signIn(firmware.page, DEMO.firmware.username, DEMO.firmware.password, DEMO.firmware.displayName);
    expect(
      await firmware.page
        .getByRole("navigation", { name: "Main" })
        .getByRole("link", { name: "Templates" })
        .count(),
    ).toBe(0);
  });
});
