// Admin creates a user; the new user signs in with the one-time temporary password, is sent to change
// it, changes it; deactivation ends their session at once.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, launch, openPage, screenshot, signIn } from "./browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser.close();
});

describe("user administration", () => {
  it("creates a user who signs in with the temporary password, changes it, and is cut off when deactivated", async () => {
    // A name of its own so the test does not depend on what other tests did to the shared server.
    const username = `e2e.${Date.now().toString(36)}`;
    const admin = await openPage(browser);
    await signIn(admin.page, DEMO.admin.username, DEMO.admin.password, DEMO.admin.displayName);
    await admin.page.goto("/admin/users");
    await admin.page.getByRole("button", { name: "New user" }).click();
    const dialog = admin.page.getByRole("dialog");
    await dialog.getByLabel("User name").fill(username);
    await dialog.getByLabel("Full name").fill("Mira Solberg");
    await dialog.getByLabel("E-mail").fill(`${username}@coastwatch.example`);
    await dialog.getByLabel("Firmware").check();
    await dialog.getByRole("button", { name: "Create user" }).click();
    const code = dialog.getByTestId("temporary-password");
    await code.waitFor();
    const temporary = (await code.textContent())?.trim() ?? "";
    expect(temporary.length).toBeGreaterThanOrEqual(10);
    await dialog.getByRole("button", { name: "Copy password" }).waitFor();
    await screenshot(admin.page, "admin-users-created");
    await dialog.getByRole("button", { name: "Done" }).click();
    const row = admin.page.getByRole("row", { name: new RegExp(username.replace(".", "\\.")) });
    await row.waitFor();
    expect(await row.textContent()).toContain("temporary password");

    const newcomer = await openPage(browser);
    await signIn(newcomer.page, username, temporary, "Mira Solberg");
    const banner = newcomer.page.getByText("You are signed in with a temporary password.");
    await banner.waitFor();
    // Nothing else answers until the temporary password is changed: the app goes to the account page.
    await newcomer.page.waitForURL(/\/account$/);
    await newcomer.page.getByLabel("Current password").fill(temporary);
    await newcomer.page.getByLabel("New password").fill("a-new-password-for-mira");
    await newcomer.page.getByRole("button", { name: "Change password" }).click();
    await newcomer.page.getByRole("status").filter({ hasText: "Password changed" }).waitFor();
    await banner.waitFor({ state: "detached" });
    await screenshot(newcomer.page, "account-changed");
    // Not yet a member of any project: the empty state says what to do next.
    await newcomer.page.getByRole("link", { name: "Tapwright home" }).click();
    await newcomer.page.getByText("Ask an admin to add you to a project.").waitFor();
    await screenshot(newcomer.page, "home-new-user");

    await admin.page.reload();
    await admin.page.getByRole("button", { name: `Deactivate ${username}` }).click();
    await admin.page.getByRole("dialog").getByRole("button", { name: "Deactivate" }).click();
    await admin.page.getByRole("dialog").waitFor({ state: "hidden" });
    expect(await row.textContent()).toContain("deactivated");

    // The newcomer's session ended: their next request is refused and the app sends them to sign in.
    await newcomer.page.goto("/projects");
    await newcomer.page.waitForURL(/\/sign-in\?next=%2Fprojects$/);
    await newcomer.page.getByLabel("User name").fill(username);
    await newcomer.page.getByLabel("Password").fill("a-new-password-for-mira");
    await newcomer.page.getByLabel("Password").press("Enter");
    await newcomer.page.getByRole("alert").filter({ hasText: "This account is deactivated" }).waitFor();
    await newcomer.context.close();
    await admin.context.close();
  });
});
