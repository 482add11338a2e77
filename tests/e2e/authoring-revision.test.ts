// The author opens a design made for this test (through the API, so it does not depend on other tests),
// sees its plots draw, edits W on the r1 draft and saves, submits it through the confirm dialog, and finds
// the revision read-only with its content hash. Screenshots and an axe check of both pages.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  createDemoDesign,
  DEMO,
  expectAccessible,
  launch,
  openPage,
  screenshot,
  signIn,
  type GuardedPage,
} from "./browser";

let browser: Browser;
let author: GuardedPage;
beforeAll(async () => {
  browser = await launch();
  author = await openPage(browser);
  await signIn(author.page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
});
afterAll(async () => {
  await browser.close();
});

/** Creates an LFM waveform design in the demo project through the API, as the signed-in author. */
async function createDesign(p: GuardedPage): Promise<{ designId: number; revisionId: number; name: string }> {
  const name = `E2E chirp ${Date.now().toString(36)}`;
  const ids = await createDemoDesign(p.page, {
    name,
    description: "Short LFM for the revision-page test (fictional programme).",
    content: {
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 5e6, pulseWidthS: 20e-6, sampleRateHz: 6.25e6 },
      rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
      fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 16, fractionLength: 15 } },
      limits: { pslDbMax: -30 },
    },
  });
  return { ...ids, name };
}

describe("design and revision pages", () => {
  it("author sees the plots, edits W, submits, and the revision turns read-only", async () => {
    const { page } = author;
    const { designId, revisionId, name } = await createDesign(author);

    await page.goto(`/designs/${designId}`);
    await page.getByRole("heading", { name }).waitFor();
    await page.getByRole("complementary", { name: "Transmit caution" }).waitFor();
    await page.getByRole("table", { name: "Revisions" }).getByRole("link", { name: "r1" }).waitFor();
    await screenshot(page, "design-page");
    await expectAccessible(page, "design-page");

    await page.getByRole("table", { name: "Revisions" }).getByRole("link", { name: "r1" }).click();
    await page.waitForURL(new RegExp(`/revisions/${revisionId}$`));
    // Both tables (tx, rx): time and spectrum plots, plus instantaneous frequency for the chirp = 6 canvases.
    await page.locator("figure canvas").nth(5).waitFor();
    const sizes = await page
      .locator("figure canvas")
      .evaluateAll((els) =>
        els.map((c) => [(c as HTMLCanvasElement).width, (c as HTMLCanvasElement).height]),
      );
    expect(sizes.length).toBe(6);
    for (const [w, h] of sizes) expect(w! > 0 && h! > 0).toBe(true);
    // 20 µs at 6.25 MHz = 125 samples per table.
    await expect.poll(() => page.getByText("125 rows").count()).toBe(2);
    await page
      .getByRole("heading", { name: "Not analysed yet" })
      .or(page.getByText("Not analysed yet"))
      .first()
      .waitFor();

    // The coefficient grid opens with full-precision values.
    await page.getByText("Coefficients (125 rows)").first().click();
    await page.getByRole("table", { name: "tx coefficients" }).getByRole("row").nth(1).waitFor();

    // Edit W of rx on the draft and save.
    const w = page.getByLabel("rx word length W (bits)");
    await w.fill("12");
    await page.getByRole("row", { name: /rx/ }).getByText("Q-3.15").waitFor();
    await page.getByLabel("rx fraction length F (bits)").fill("11");
    await page.getByRole("row", { name: /rx/ }).getByText("Q1.11").waitFor();
    // An out-of-range W is refused by the shared schema before anything is sent.
    await w.fill("40");
    await page.getByText(/less than or equal to 32|at most 32|<=32/).waitFor();
    await w.fill("12");
    // Wait for the PATCH itself: the button is disabled while the request is in flight, so its state alone races.
    const patched = page.waitForResponse(
      (r) => r.url().endsWith(`/api/revisions/${revisionId}`) && r.request().method() === "PATCH",
    );
    await page.getByRole("button", { name: "Save fixed-point spec" }).click();
    expect((await patched).status()).toBe(200);
    await expect
      .poll(async () => page.getByRole("button", { name: "Save fixed-point spec" }).isDisabled())
      .toBe(true);
    const saved = (await (await page.request.get(`/api/revisions/${revisionId}`)).json()) as {
      content: { fixedPoint: { rx: { wordLength: number; fractionLength: number } } };
    };
    expect(saved.content.fixedPoint.rx).toMatchObject({ wordLength: 12, fractionLength: 11 });
    // Saving re-materializes the tables (new ids), so the plots draw again.
    await page.locator("figure canvas").nth(5).waitFor();
    expect(await page.getByRole("button", { name: "Save limits" }).isDisabled()).toBe(true);
    await screenshot(page, "revision-page-draft");
    await expectAccessible(page, "revision-page-draft");

    // Submitting needs a finished analysis of this content (issue 6): run it, then submit through the
    // confirm dialog, which says what cannot be undone.
    const analysis = page.getByRole("region", { name: "Analysis" });
    await analysis.getByRole("button", { name: "Run analysis" }).click();
    await analysis.getByRole("link", { name: "Open the report" }).waitFor({ timeout: 90_000 });
    const submitButton = page.getByRole("button", { name: "Submit for review" });
    await expect.poll(() => submitButton.isEnabled()).toBe(true);
    await submitButton.click();
    const dialog = page.getByRole("dialog");
    await dialog.getByText("This cannot be undone").waitFor();
    await dialog.getByText(/needs a new revision, r2/).waitFor();
    await expectAccessible(page, "revision-submit-dialog");
    await dialog.getByRole("button", { name: "Submit r1" }).click();
    await dialog.waitFor({ state: "hidden" });

    await page.getByText("In review", { exact: true }).first().waitFor();
    await page
      .getByText(/Content hash/)
      .first()
      .waitFor();
    expect(await page.getByLabel("rx word length W (bits)").count()).toBe(0);
    expect(await page.getByRole("button", { name: "Submit for review" }).count()).toBe(0);
    await page.getByRole("table", { name: "Fixed-point spec" }).getByText("Q1.11").waitFor();
    await page.locator("figure canvas").nth(5).waitFor();
    await screenshot(page, "revision-page-in-review");
    await expectAccessible(page, "revision-page-in-review");

    const detail = (await (await page.request.get(`/api/revisions/${revisionId}`)).json()) as {
      revision: { state: string; contentHash: string | null };
    };
    expect(detail.revision.state).toBe("in_review");
    expect(detail.revision.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(author.foreign).toEqual([]);
    expect(author.pageErrors).toEqual([]);
  });
});
