// The printed report: Chromium's PDF (playwright-core page.pdf, Debian's /usr/bin/chromium with the flags of
// STACK.md) of report.html, on A4 and on Letter, read back with poppler's pdftotext, holds the header and every
// figure and limit name. Also covers a FIR design (response with masks) next to a waveform.
import { spawnSync } from "node:child_process";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { AnalysisWorker } from "../../server/jobs/worker";
import { METRIC_LABELS } from "../../server/reports/metrics";
import { ReportDocumentSchema } from "../../shared/schemas/analyses";
import { newDesign, pollAnalysis, taylorLfm, testWorker } from "./analysis-helpers";
import { launch } from "../e2e/browser";
import { failOnConsoleError, signedIn, useApiTestDatabase, type Agent } from "./helpers";

const t = useApiTestDatabase();
failOnConsoleError();

/** docs/analysis.md worked example 2: a 60 dB Kaiser low-pass FIR, 16-bit. */
const firLowpass = {
  kind: "filter",
  fir: {
    kind: "design",
    band: "lowpass",
    sampleRateHz: 100e6,
    cutoffHz: 12.5e6,
    transitionHz: 5e6,
    stopbandAttenuationDb: 60,
  },
  fixedPoint: { fir: { wordLength: 16, fractionLength: 15 } },
  limits: { stopbandAttenuationDbMin: 55, passbandRippleDbMax: 0.05 },
  sweep: { minBits: 6, maxBits: 18 },
};

let worker: AnalysisWorker;
let browser: Browser;
let author: Agent;
beforeAll(async () => {
  worker = await testWorker(t.database);
  browser = await launch();
  author = await signedIn(t.app, "author");
});
afterAll(async () => {
  await browser?.close();
  await worker?.stop(5000);
});

/** Text of a PDF by pdftotext (poppler-utils), white space removed so line and cell breaks do not matter. */
function pdfText(pdf: Buffer): string {
  const r = spawnSync("pdftotext", ["-enc", "UTF-8", "-", "-"], { input: pdf, encoding: "utf8" });
  if (r.status !== 0) throw new Error(`pdftotext failed (apt-get install -y poppler-utils): ${r.stderr}`);
  return r.stdout.replace(/\s+/g, "");
}
const squash = (s: string) => s.replace(/\s+/g, "");

describe.each([
  ["waveform", taylorLfm, "A4"],
  ["filter", firLowpass, "Letter"],
] as const)("the printed %s report", (_kind, content, format) => {
  it(`prints on ${format} with the header and every figure and limit`, async () => {
    const { revision } = await newDesign(t, author, content);
    expect((await author.post(`/api/revisions/${revision.id}/analysis`)).status).toBe(202);
    await pollAnalysis(author, revision.id, (a) => a?.state === "done");
    const doc = ReportDocumentSchema.parse(
      (await author.get(`/api/revisions/${revision.id}/report.json`)).body,
    );
    const html = (await author.get(`/api/revisions/${revision.id}/report.html`)).text;

    const context = await browser.newContext();
    const page = await context.newPage();
    const foreign: string[] = [];
    page.on("request", (req) => {
      if (!req.url().startsWith("data:") && req.url() !== "about:blank") foreign.push(req.url());
    });
    await page.setContent(html, { waitUntil: "load" });
    const pdf = await page.pdf({ format, printBackground: true });
    await context.close();
    expect(foreign).toEqual([]);
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");

    const text = pdfText(pdf);
    for (const [k, v] of Object.entries(doc.header)) expect(text, `header ${k}`).toContain(squash(v));
    for (const label of ["Project", "Design", "Revision", "Contenthash", "Generatedat", "Softwareversion"])
      expect(text).toContain(label);
    for (const key of Object.keys(doc.report.fixed)) expect(text, key).toContain(squash(METRIC_LABELS[key]!));
    expect(text).toContain(squash(METRIC_LABELS.coefficientSqnrDb!));
    for (const c of doc.report.limits)
      expect(text, c.name).toContain(squash(METRIC_LABELS[c.name.replace(/(Max|Min)$/, "")]!));
    expect(doc.report.pass).toBe(true);
    expect(text).toContain(`All${doc.report.limits.length}acceptancelimitspass.`);
  }, 120_000);
});
