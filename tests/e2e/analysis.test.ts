// Analysis end to end: an author runs the analysis of a draft, watches it finish, reads the verdict and the
// sweep on the report page, and tries a smaller W in the what-if panel (computed in a Web Worker) without
// saving. The design is made for this test through the API, so no other test's edits can change it.
// Screenshots of the analysis section, the what-if panel and the report page; axe on each.
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

/** A Taylor-weighted LFM draft with limits, a sweep and a Doppler value, created as the signed-in author. */
async function createDesign(p: GuardedPage): Promise<number> {
  const { revisionId } = await createDemoDesign(p.page, {
    name: `E2E analysed chirp ${Date.now().toString(36)}`,
    description:
      "2 MHz / 100 µs LFM with Taylor receive weighting, for the analysis test (fictional programme).",
    content: {
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 2e6, pulseWidthS: 100e-6, sampleRateHz: 2.5e6 },
      rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
      fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
      limits: {
        pslDbMax: -30,
        islrDbMax: -20,
        mismatchLossDbMax: 1.5,
        peakLossDbMax: 0.1,
        coefficientSqnrDbMin: 50,
      },
      sweep: { minBits: 6, maxBits: 14 },
      dopplerHz: 5000,
    },
  });
  return revisionId;
}

describe("analysis", () => {
  it("author runs the analysis, sees pass/fail and the sweep, and tries a smaller W", async () => {
    const { page } = author;
    const revisionId = await createDesign(author);
    await page.goto(`/revisions/${revisionId}`);
    const section = page.getByRole("region", { name: "Analysis" });
    await section.getByText("Not analysed yet").waitFor();

    await section.getByRole("button", { name: "Run analysis" }).click();
    // Polling carries it through queued/running to done; the finish toast says the verdict.
    await section.getByRole("link", { name: "Open the report" }).waitFor({ timeout: 90_000 });
    await page.getByRole("status").filter({ hasText: "Analysis finished" }).waitFor();
    await section.getByText("All limits pass").waitFor();
    await expect.poll(() => section.getByText(/smallest passing word length W = \d+/).count()).toBe(1);
    await screenshot(page, "analysis-section");
    await expectAccessible(page, "analysis-section");

    // What-if: the saved PSL beside the preview; W 12 → 5 on rx changes the preview's PSL, nothing is saved.
    const whatIf = page.getByRole("region", { name: /What if/ });
    const psl = whatIf.getByTestId("what-if-pslDb");
    await expect.poll(() => psl.textContent(), { timeout: 30_000 }).toMatch(/^-\d+\.\d\d dB$/);
    const before = await psl.textContent();
    await whatIf.getByLabel("Word length W (bits)").fill("5");
    await expect.poll(() => psl.textContent(), { timeout: 30_000 }).not.toBe(before);
    await expect.poll(() => psl.textContent()).toMatch(/^-\d+\.\d\d dB$/);
    await whatIf.getByText(/Computed in \d+ ms/).waitFor();
    await whatIf.getByRole("button", { name: "Apply to draft" }).waitFor();
    await screenshot(page, "what-if-panel");
    await expectAccessible(page, "what-if-panel");
    // Still unsaved: the stored content keeps W = 12.
    const stored = (await (await page.request.get(`/api/revisions/${revisionId}`)).json()) as {
      content: { fixedPoint: { rx: { wordLength: number } } };
    };
    expect(stored.content.fixedPoint.rx.wordLength).toBe(12);

    await section.getByRole("link", { name: "Open the report" }).click();
    await page.waitForURL(new RegExp(`/revisions/${revisionId}/report$`));
    await page.getByRole("heading", { name: /Report ·/ }).waitFor();
    await page.getByRole("list", { name: "Limits of table rx" }).getByText("pass").first().waitFor();
    const metrics = page.getByRole("table", { name: "Metrics" });
    await metrics.getByRole("row", { name: /Peak sidelobe level/ }).waitFor();
    const sweep = page.getByRole("table", { name: "Bit-width sweep" });
    await expect.poll(() => sweep.getByRole("row").count()).toBe(1 + 9);
    await page.getByText(/Recommended word length: W = \d+/).waitFor();
    await page.getByText("white noise", { exact: false }).first().waitFor();
    // Every plot draws: compressed ×2, spectrum, Doppler cut, coefficient error ×2, three sweep plots.
    await expect
      .poll(() => page.locator("figure canvas").count(), { timeout: 30_000 })
      .toBeGreaterThanOrEqual(9);
    await expect(page.getByRole("link", { name: "Printable report" }).getAttribute("href")).resolves.toBe(
      `/api/revisions/${revisionId}/report.html`,
    );
    await expect(page.getByRole("link", { name: "JSON" }).getAttribute("href")).resolves.toBe(
      `/api/revisions/${revisionId}/report.json`,
    );
    await screenshot(page, "analysis-report");
    await expectAccessible(page, "analysis-report");

    expect(author.foreign).toEqual([]);
    expect(author.pageErrors).toEqual([]);
  });

  it("a seeded filter design: the report draws the FIR response with its stopband mask", async () => {
    const { page } = author;
    const projects = (await (await page.request.get("/api/projects")).json()) as {
      projects: Array<{ id: number; slug: string }>;
    };
    const project = projects.projects.find((x) => x.slug === "coastwatch-s")!;
    const list = (await (await page.request.get(`/api/projects/${project.id}/designs`)).json()) as {
      designs: Array<{ name: string; latestRevision: { id: number } | null }>;
    };
    const fir = list.designs.find((d) => d.name === "4:1 decimation FIR");
    expect(fir?.latestRevision, "the seed has the 4:1 decimation FIR").toBeTruthy();
    const revisionId = fir!.latestRevision!.id;

    await page.goto(`/revisions/${revisionId}`);
    const section = page.getByRole("region", { name: "Analysis" });
    const run = section.getByRole("button", { name: "Run analysis" });
    // The demo seed (or another run) may have analysed it already: same content, same report. Wait until the
    // status is known — the button stays disabled while it loads — then run it only if there is no report.
    const report = section.getByRole("link", { name: "Open the report" });
    await expect
      .poll(async () => (await report.count()) > 0 || (await run.isEnabled()), { timeout: 60_000 })
      .toBe(true);
    if ((await report.count()) === 0) await run.click();
    await section.getByRole("link", { name: "Open the report" }).waitFor({ timeout: 90_000 });
    await section.getByRole("link", { name: "Open the report" }).click();
    await page.getByRole("heading", { name: /Report · 4:1 decimation FIR/ }).waitFor();
    await page
      .getByRole("table", { name: "Metrics" })
      .getByRole("row", { name: /Stopband attenuation/ })
      .waitFor();
    await page.getByRole("group", { name: /FIR magnitude response: Float, Fixed, Stopband mask/ }).waitFor();
    await page.getByText("Coefficient error, table fir").waitFor();
    const html = await page.request.get(`/api/revisions/${revisionId}/report.html`);
    expect(html.status()).toBe(200);
    expect(await html.text()).toContain("4:1 decimation FIR");
    await screenshot(page, "analysis-report-filter");
    await expectAccessible(page, "analysis-report-filter");
    expect(author.pageErrors).toEqual([]);
  });
});
