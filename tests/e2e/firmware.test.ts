// Firmware end to end: two releases of a Barker-13 design are made through the API (author analyses, submits
// and releases; the reviewer approves), then the firmware engineer finds the latest release in the list, opens
// it, downloads the bundle (its SHA-256 must equal the one the page shows), reads the diff against 1.0.0, and
// manages an API token on the account page. Screenshots and axe on each page.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import type { APIRequestContext, Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, expectAccessible, launch, openPage, screenshot, signIn, type GuardedPage } from "./browser";

let browser: Browser;
let author: GuardedPage;
let reviewer: GuardedPage;
let firmware: GuardedPage;

const DESIGN = `E2E Barker-13 bench pulse ${Date.now().toString(36)}`;
const content = (rxBits: number) => ({
  kind: "waveform",
  tx: { kind: "phase-code", code: { kind: "barker", length: 13 }, sampleRateHz: 1e6 },
  fixedPoint: {
    tx: { wordLength: 16, fractionLength: 15 },
    rx: { wordLength: rxBits, fractionLength: rxBits - 1 },
  },
  interpolation: 1,
});

async function ok(res: Awaited<ReturnType<APIRequestContext["get"]>>, what: string): Promise<unknown> {
  expect(res.ok(), `${what}: ${res.status()} ${await res.text()}`).toBe(true);
  return res.json();
}

/** Analyse, submit, approve and release the revision as `version`; returns the release id. */
async function release(revisionId: number, version: string, notes: string): Promise<number> {
  const a = author.page.request;
  await ok(await a.post(`/api/revisions/${revisionId}/analysis`), "analysis");
  // A plain loop: expect.poll only runs inside a test, and this is fixture set-up.
  const deadline = Date.now() + 90_000;
  for (;;) {
    const status = (await ok(await a.get(`/api/revisions/${revisionId}/analysis`), "status")) as {
      analysis: { state: string; error: string | null };
    };
    if (status.analysis.state === "done") break;
    if (status.analysis.state === "failed" || Date.now() > deadline)
      throw new Error(`analysis ${status.analysis.state}: ${status.analysis.error}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  await ok(await a.post(`/api/revisions/${revisionId}/submit`), "submit");
  await ok(
    await reviewer.page.request.post(`/api/revisions/${revisionId}/decision`, {
      data: { decision: "approved", comment: "Bench figures agree." },
    }),
    "approve",
  );
  const rel = (await ok(
    await a.post(`/api/revisions/${revisionId}/release`, { data: { version, notes } }),
    "release",
  )) as { release: { id: number } };
  return rel.release.id;
}

let firstId: number;
let latestId: number;
beforeAll(async () => {
  browser = await launch();
  [author, reviewer, firmware] = await Promise.all([openPage(browser), openPage(browser), openPage(browser)]);
  await signIn(author.page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
  await signIn(reviewer.page, DEMO.reviewer.username, DEMO.reviewer.password, DEMO.reviewer.displayName);
  await signIn(firmware.page, DEMO.firmware.username, DEMO.firmware.password, DEMO.firmware.displayName);

  const a = author.page.request;
  const projects = (await ok(await a.get("/api/projects"), "projects")) as {
    projects: Array<{ id: number; slug: string }>;
  };
  const project = projects.projects.find((p) => p.slug === "coastwatch-s")!;
  const created = (await ok(
    await a.post(`/api/projects/${project.id}/designs`, {
      data: {
        name: DESIGN,
        description: "Short bench pulse for the firmware hand-off test (fictional programme).",
        content: content(16),
      },
    }),
    "create design",
  )) as { design: { id: number }; revision: { id: number } };
  firstId = await release(created.revision.id, "1.0.0", "First issue for the receiver bench.");
  const r2 = (await ok(await a.post(`/api/designs/${created.design.id}/revisions`), "new revision")) as {
    revision: { id: number };
  };
  await ok(await a.patch(`/api/revisions/${r2.revision.id}`, { data: { content: content(12) } }), "edit r2");
  latestId = await release(
    r2.revision.id,
    "1.1.0",
    "Receive words narrowed to 12 bits\nto fit the DSP slice budget.",
  );
}, 240_000);

afterAll(async () => {
  await browser.close();
});

describe("firmware engineer", () => {
  it("finds the latest release, downloads it with a matching SHA-256, and reads the diff", async () => {
    const { page } = firmware;
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Releases" }).click();
    await page.getByRole("heading", { name: "Releases" }).waitFor();
    const filters = page.getByRole("form", { name: "Filters" });
    await filters.getByLabel("Project").selectOption("coastwatch-s");
    await filters.getByLabel("Design").selectOption({ label: DESIGN });
    await filters.getByLabel("Status").selectOption("active");
    await page.waitForURL(/status=active/);
    expect(new URL(page.url()).searchParams.get("project")).toBe("coastwatch-s");
    const table = page.getByRole("table", { name: "Releases" });
    await expect.poll(() => table.getByRole("row").count()).toBe(1 + 2);
    // Newest first: 1.1.0 above 1.0.0.
    await expect.poll(() => table.getByRole("row").nth(1).getByRole("link").textContent()).toBe("1.1.0");
    await screenshot(page, "firmware-releases");
    await expectAccessible(page, "firmware-releases");

    // The URL keeps the filters: reloading shows the same list.
    await page.reload();
    await expect.poll(() => page.getByRole("table", { name: "Releases" }).getByRole("row").count()).toBe(3);

    await table.getByRole("link", { name: "1.1.0" }).click();
    await page.waitForURL(new RegExp(`/releases/${latestId}`));
    await page.getByRole("heading", { name: new RegExp(`${DESIGN} 1\\.1\\.0`) }).waitFor();
    await page.getByRole("complementary", { name: "Transmit caution" }).waitFor();
    await page.getByText("to fit the DSP slice budget.").waitFor();
    const files = page.getByRole("table", { name: "Bundle files" });
    await files.getByRole("cell", { name: "manifest.schema.json", exact: true }).waitFor();
    await page
      .getByText(/npm run pull -- 'coastwatch-s\/E2E Barker-13 bench pulse [a-z0-9]+@1\.1\.0' --out DIR/)
      .waitFor();
    await page.getByText(/curl -fSL -H "Authorization: Bearer \$TAPWRIGHT_TOKEN"/).waitFor();

    const shown = (await page.getByTestId("bundle-sha256").textContent())!.trim();
    expect(shown).toMatch(/^[0-9a-f]{64}$/);
    const [download] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Download bundle" }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^coastwatch-s-.*-1\.1\.0\.zip$/);
    const file = await download.path();
    // node:crypto's SHA-256 of the bytes the browser saved, against the page's figure.
    expect(createHash("sha256").update(readFileSync(file)).digest("hex")).toBe(shown);

    // Diff against the nearest earlier version, chosen by default.
    const diff = page.getByRole("region", { name: "Changes against another release" });
    await expect.poll(() => diff.getByLabel("Compare with").inputValue()).not.toBe("");
    const spec = diff.getByRole("table", { name: "Changed spec fields" });
    await spec.getByRole("row", { name: /rx Word length W \(bits\) 16 12/ }).waitFor();
    // Derived: ±(1 − 2^−15) → ±(1 − 2^−11) is 2^−11 − 2^−15 = 0.9375 LSB of Q1.11; tx is unchanged.
    await expect.poll(() => diff.getByTestId("max-lsb-rx").textContent()).toBe("0.9375 LSB");
    await expect.poll(() => diff.getByTestId("max-lsb-tx").textContent()).toBe("0 LSB");
    // Richards, Fundamentals of Radar Signal Processing, 2nd ed., 2014, Table 4.1: Barker-13 PSL −22.28 dB.
    await diff
      .getByRole("table", { name: "Metric changes" })
      .getByRole("row", { name: /Peak sidelobe level \(PSL\) -22\.28 dB/ })
      .waitFor();
    await screenshot(page, "firmware-release");
    await expectAccessible(page, "firmware-release");

    expect(firmware.foreign).toEqual([]);
    expect(firmware.pageErrors).toEqual([]);
  });

  it("a withdrawn release shows the banner with its reason and stays downloadable", async () => {
    await ok(
      await author.page.request.post(`/api/releases/${firstId}/withdraw`, {
        data: { reason: "Q1.15 receive words overflow the DSP slice." },
      }),
      "withdraw",
    );
    const { page } = firmware;
    await page.goto(`/releases/${firstId}`);
    const banner = page.getByRole("complementary", { name: "Withdrawn" });
    await banner.getByText("Reason: Q1.15 receive words overflow the DSP slice.").waitFor();
    await page.getByRole("link", { name: "Download bundle" }).waitFor();
    await page.goto("/releases?status=withdrawn");
    await page
      .getByRole("table", { name: "Releases" })
      .getByRole("link", { name: "1.0.0" })
      .first()
      .waitFor();
    await page.goto(`/releases/${firstId}`);
    await banner.waitFor();
    await screenshot(page, "firmware-release-withdrawn");
    await expectAccessible(page, "firmware-release-withdrawn");
  });

  it("creates a read token (shown once), sees it listed, and revokes it", async () => {
    const { page } = firmware;
    await page.goto("/account");
    const section = page.getByRole("region", { name: "API tokens" });
    await section.getByLabel("Token name").fill("bench build");
    await expect(section.getByLabel("Scope").inputValue()).resolves.toBe("read");
    await section.getByRole("button", { name: "Create token" }).click();
    const secret = (await section.getByTestId("new-token-secret").textContent())!;
    expect(secret).toMatch(/^tw_/);
    await section.getByText("it is shown only this once").waitFor();
    const row = section
      .getByRole("table", { name: "My API tokens" })
      .getByRole("row", { name: /bench build/ });
    await row.getByText(`${secret.slice(0, 8)}…`).waitFor();
    await screenshot(page, "firmware-token-created");
    await expectAccessible(page, "firmware-token-created");

    // The secret works for a download, then revoking stops it.
    const api = page.context().request;
    const headers = { Authorization: `Bearer ${secret}` };
    expect((await api.get(`/api/releases/${latestId}`, { headers })).status()).toBe(200);
    await section.getByRole("button", { name: "I have copied it" }).click();
    await expect.poll(() => section.getByTestId("new-token-secret").count()).toBe(0);
    await row.getByRole("button", { name: "Revoke bench build" }).click();
    const dialog = page.getByRole("dialog", { name: /Revoke/ });
    await dialog.getByText("This cannot be undone").waitFor();
    await dialog.getByRole("button", { name: "Revoke token" }).click();
    await row.getByText(/revoked/).waitFor();
    const fresh = await browser.newContext({ baseURL: new URL(page.url()).origin });
    expect((await fresh.request.get(`/api/releases/${latestId}`, { headers })).status()).toBe(401);
    await fresh.close();
    await screenshot(page, "firmware-token-revoked");
    await expectAccessible(page, "firmware-token-revoked");
    expect(firmware.pageErrors).toEqual([]);
  });
});
