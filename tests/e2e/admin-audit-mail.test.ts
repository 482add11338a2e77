// Admin reads the audit trail (filters kept in the URL, CSV link with the same filters) and the SMTP
// sink's mailbox (a message sent over real SMTP to the server's sink, HTML in a script-less sandbox).
import nodemailer from "nodemailer";
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

describe("admin audit trail and mailbox", () => {
  it("shows the admin's own sign-in, filters by action in the URL, and offers the CSV of that filter", async () => {
    const { page } = await openPage(browser);
    await signIn(page, DEMO.admin.username, DEMO.admin.password, DEMO.admin.displayName);
    await page.getByRole("link", { name: "Audit trail" }).click();
    await page.getByRole("heading", { name: "Audit trail" }).waitFor();
    const table = page.getByRole("table", { name: "Audit events" });
    await table.waitFor();
    await page
      .getByRole("row", { name: /admin signed in/ })
      .first()
      .waitFor();

    await page.getByLabel("Action").selectOption("auth.sign-in");
    await page.waitForURL(/[?&]action=auth\.sign-in(&|$)/);
    // The previous page stays on screen (aria-busy) while the filtered one loads: poll until it is replaced.
    await expect
      .poll(
        async () => {
          const texts = await table.locator("tbody tr").allTextContents();
          return texts.length > 0 && texts.every((t) => t.includes("auth.sign-in"));
        },
        { timeout: 15_000 },
      )
      .toBe(true);
    await page.locator('[data-testid="audit-results"][aria-busy="false"]').waitFor();
    const href = await page.getByRole("link", { name: "Export CSV" }).getAttribute("href");
    expect(href).toBe("/api/admin/audit.csv?action=auth.sign-in");
    const csv = await page.request.get(href ?? "");
    expect(csv.status()).toBe(200);
    expect((await csv.text()).split("\r\n")[0]).toMatch(/^id,at,actor_kind,/);

    // A shared link reproduces the view.
    await page.reload();
    await expect.poll(() => page.getByLabel("Action").inputValue(), { timeout: 10_000 }).toBe("auth.sign-in");
    await screenshot(page, "admin-audit-trail");
    await expectAccessible(page, "audit trail");
  });

  it("lists a message received over SMTP and shows its text and its HTML in a sandboxed frame", async () => {
    const { page } = await openPage(browser);
    await signIn(page, DEMO.admin.username, DEMO.admin.password, DEMO.admin.displayName);
    const info = (await (await page.request.get("/api/admin/mailbox")).json()) as { sinkPort: number | null };
    expect(info.sinkPort).not.toBeNull();

    const subject = `[coastwatch-s] Mailbox check ${Date.now().toString(36)}`;
    const transport = nodemailer.createTransport({
      host: "127.0.0.1",
      port: info.sinkPort ?? 0,
      secure: false,
      ignoreTLS: true,
    });
    await transport.sendMail({
      from: "Tapwright <tapwright@coastwatch.example>",
      to: "priya.lund@coastwatch.example",
      subject,
      text: "Plain part: release 1.0.0 of the long-pulse chirp.",
      html: '<p>HTML part</p><script>document.body.dataset.ran = "yes"</script>',
    });
    transport.close();

    await page.getByRole("link", { name: "Mailbox" }).click();
    await page.getByRole("heading", { name: "Mailbox" }).waitFor();
    await page.getByRole("link", { name: subject }).click();
    await page.waitForURL(/\/admin\/mailbox\/\d+$/);
    const message = page.getByRole("article", { name: "Message" });
    await message.getByText("Plain part: release 1.0.0 of the long-pulse chirp.").waitFor();
    expect(await message.getByText("priya.lund@coastwatch.example").count()).toBeGreaterThan(0);

    const frame = page.getByTitle("HTML part of the message");
    expect(await frame.getAttribute("sandbox")).toBe("");
    const inner = page.frameLocator('iframe[title="HTML part of the message"]');
    await inner.getByText("HTML part").waitFor();
    // The sandbox has no allow-scripts: the message's script never ran.
    expect(await inner.locator("body").getAttribute("data-ran")).toBeNull();
    await screenshot(page, "admin-mailbox-message");
    await expectAccessible(page, "mailbox");
  });

  it("gives a non-admin the server's refusal on the audit page, and no Admin entries", async () => {
    const { page } = await openPage(browser);
    await signIn(page, DEMO.reviewer.username, DEMO.reviewer.password, DEMO.reviewer.displayName);
    expect(await page.getByRole("link", { name: "Audit trail" }).count()).toBe(0);
    await page.goto("/admin/audit");
    await page.getByRole("heading", { name: "Audit trail" }).waitFor();
    const refusal = page.getByRole("alert").filter({ hasText: "This needs the admin role" }).first();
    await refusal.waitFor({ timeout: 10_000 }).catch(async (err: unknown) => {
      await screenshot(page, "admin-audit-refused-debug");
      throw new Error(`${String(err)}\n${await page.locator("main").innerText()}`);
    });
    await screenshot(page, "admin-audit-refused");
  });
});
