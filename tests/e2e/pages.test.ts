// Every page: a screenshot, an axe-core check with no serious or critical violation, no request to any
// other host, no uncaught error. Also the keyboard shortcuts and the search kept in the URL.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, expectAccessible, launch, openPage, screenshot, signIn, type GuardedPage } from "./browser";

let browser: Browser;
let admin: GuardedPage;
beforeAll(async () => {
  browser = await launch();
  admin = await openPage(browser);
  await signIn(admin.page, DEMO.admin.username, DEMO.admin.password, DEMO.admin.displayName);
});
afterAll(async () => {
  await browser.close();
});

describe("every page looks finished and passes axe", () => {
  it("sign-in page", async () => {
    const guest = await openPage(browser);
    await guest.page.goto("/sign-in");
    await guest.page.getByRole("button", { name: "Sign in" }).waitFor();
    await screenshot(guest.page, "sign-in");
    await expectAccessible(guest.page, "sign-in");
    // Wrong-password state too, since the error colours must pass contrast.
    await guest.page.getByLabel("User name").fill("admin");
    await guest.page.getByLabel("Password").fill("wrong-password");
    await guest.page.getByLabel("Password").press("Enter");
    await guest.page.getByRole("alert").waitFor();
    await screenshot(guest.page, "sign-in-error");
    await expectAccessible(guest.page, "sign-in-error");
    expect(guest.foreign).toEqual([]);
    await guest.context.close();
  });

  const PAGES: Array<{ name: string; path: string; ready: (p: GuardedPage) => Promise<void> }> = [
    {
      name: "home-admin",
      path: "/",
      ready: (p) => p.page.getByRole("table", { name: "My projects" }).waitFor(),
    },
    {
      name: "projects",
      path: "/projects",
      ready: (p) => p.page.getByRole("table", { name: "Projects" }).waitFor(),
    },
    {
      name: "project",
      path: "/projects/1",
      ready: (p) => p.page.getByRole("table", { name: "Members" }).waitFor(),
    },
    {
      name: "account",
      path: "/account",
      ready: (p) => p.page.getByRole("button", { name: "Change password" }).waitFor(),
    },
    {
      name: "admin-users",
      path: "/admin/users",
      ready: (p) => p.page.getByRole("table", { name: "Users" }).waitFor(),
    },
    {
      name: "not-found",
      path: "/no-such-place",
      ready: (p) => p.page.getByRole("heading", { name: "Page not found" }).waitFor(),
    },
    {
      name: "projects-empty-search",
      path: "/projects?q=zzz",
      ready: (p) => p.page.getByText("No project matches").waitFor(),
    },
  ];
  for (const { name, path, ready } of PAGES) {
    it(name, async () => {
      await admin.page.goto(path);
      await ready(admin);
      await screenshot(admin.page, name);
      await expectAccessible(admin.page, name);
      expect(admin.foreign).toEqual([]);
      expect(admin.pageErrors).toEqual([]);
    });
  }

  it("dialogs: new user, edit roles, deactivate", async () => {
    const { page } = admin;
    await page.goto("/admin/users");
    await page.getByRole("button", { name: "New user" }).click();
    const dialog = page.getByRole("dialog");
    await dialog.waitFor();
    // Submitting empty shows the schema's messages next to the fields.
    await dialog.getByRole("button", { name: "Create user" }).click();
    await dialog.getByText("choose at least one role").waitFor();
    await screenshot(page, "admin-users-new");
    await expectAccessible(page, "admin-users-new");
    await page.keyboard.press("Escape");
    await dialog.waitFor({ state: "hidden" });
    await page.getByRole("button", { name: "Edit roles of reviewer" }).click();
    await page.getByRole("dialog").waitFor();
    await screenshot(page, "admin-users-roles");
    await expectAccessible(page, "admin-users-roles");
    await page.keyboard.press("Escape");
    await page.getByRole("button", { name: "Deactivate firmware" }).click();
    await page.getByRole("dialog").getByText("Their sessions end now").waitFor();
    await screenshot(page, "admin-users-deactivate");
    await expectAccessible(page, "admin-users-deactivate");
    await page.getByRole("dialog").getByRole("button", { name: "Cancel" }).click();
    await page.getByRole("dialog").waitFor({ state: "hidden" });
    expect(admin.foreign).toEqual([]);
  });

  it("home of a member of one project (reviewer)", async () => {
    const reviewer = await openPage(browser);
    await signIn(reviewer.page, DEMO.reviewer.username, DEMO.reviewer.password, DEMO.reviewer.displayName);
    await reviewer.page.getByRole("table", { name: "My projects" }).waitFor();
    await screenshot(reviewer.page, "home-reviewer");
    await expectAccessible(reviewer.page, "home-reviewer");
    await reviewer.page.goto("/projects/2");
    // Not a member: the server answers 404, so the page says so rather than "forbidden".
    await reviewer.page.getByRole("heading", { name: "Project not found" }).waitFor();
    await screenshot(reviewer.page, "project-not-member");
    expect(reviewer.foreign).toEqual([]);
    await reviewer.context.close();
  });
});

describe("keyboard and URL state", () => {
  it("`g p` opens projects, `/` focuses the search, and the filter lives in the URL", async () => {
    const { page } = admin;
    await page.goto("/");
    await page.getByRole("table", { name: "My projects" }).waitFor();
    await page.keyboard.press("g");
    await page.keyboard.press("p");
    await page.waitForURL(/\/projects$/);
    await page.getByRole("table", { name: "Projects" }).waitFor();
    // Right after a client-side navigation the page may still be settling; a second `/` is what a person would do.
    const focused = () => page.evaluate(() => document.activeElement?.id);
    await page.keyboard.press("/");
    await expect
      .poll(async () => {
        if ((await focused()) !== "project-search") await page.keyboard.press("/");
        return focused();
      })
      .toBe("project-search");
    await page.keyboard.type("coast");
    // replaceState is a same-document navigation: poll the URL rather than wait for a load event.
    await expect.poll(() => page.url()).toMatch(/\/projects\?q=coast$/);
    expect(await page.getByRole("table", { name: "Projects" }).getByRole("link").allTextContents()).toEqual([
      "Coastwatch-S surveillance radar",
    ]);
  });
});
