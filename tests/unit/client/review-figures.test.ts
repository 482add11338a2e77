// The review page's comparison rows and limit chips (src/features/reviews/lib/figures.ts).
import { describe, expect, it } from "vitest";
import type { ReportSummary } from "@shared/schemas/reviews";
import { chipOf, compareFigures, shortHash } from "@/features/reviews/lib/figures";

const summary = (fixed: Record<string, number | null>): ReportSummary => ({
  contentHash: "c".repeat(64),
  reportHash: "r".repeat(64),
  pass: true,
  fixed,
  float: {},
  diff: {},
  limits: [],
  finishedAt: null,
});

describe("compareFigures", () => {
  it("differences are new − previous: Barker-13 against Barker-11 PSL", () => {
    // Richards, Fundamentals of Radar Signal Processing, 2nd ed., 2014, Table 4.1: Barker PSL = 20·log10(1/N),
    // −22.28 dB (N = 13) and −20.83 dB (N = 11). The difference is 20·log10(11/13), computed here independently.
    const current = summary({ pslDb: 20 * Math.log10(1 / 13) });
    const previous = summary({ pslDb: 20 * Math.log10(1 / 11) });
    const [psl] = compareFigures("waveform", current, previous);
    expect(psl?.key).toBe("pslDb");
    expect(psl?.current).toBeCloseTo(-22.28, 2);
    expect(psl?.previous).toBeCloseTo(-20.83, 2);
    expect(psl?.delta).toBeCloseTo(20 * Math.log10(11 / 13), 12);
    expect(psl?.delta).toBeCloseTo(-1.45, 2);
  });

  it("keeps the reading order of the analysis page and leaves out figures neither report has", () => {
    const rows = compareFigures("waveform", summary({ islrDb: -9.7, pslDb: -13.26 }), null);
    expect(rows.map((r) => r.key)).toEqual(["pslDb", "islrDb"]);
    expect(rows.every((r) => r.previous === null && r.delta === null)).toBe(true);
  });

  it("a figure only the previous release has still shows, without a difference", () => {
    const rows = compareFigures("filter", summary({}), summary({ stopbandAttenuationDb: 70 }));
    expect(rows).toEqual([
      {
        key: "stopbandAttenuationDb",
        label: "Stopband attenuation",
        unit: "dB",
        current: null,
        previous: 70,
        delta: null,
      },
    ]);
  });
});

describe("chipOf", () => {
  it("names known limits as the report page does and keeps the bound", () => {
    expect(chipOf({ name: "pslDbMax", limit: -30, value: -28.5, pass: false })).toMatchObject({
      label: "PSL",
      bound: "max",
      pass: false,
    });
    expect(chipOf({ name: "coefficientSqnrDbMin", limit: 60, value: 74.0 })).toMatchObject({
      label: "Coefficient SQNR",
      bound: "min",
      pass: false,
    });
    expect(chipOf({ name: "somethingNew", limit: 1, value: null, pass: true })).toMatchObject({
      label: "somethingNew",
      pass: true,
    });
  });
});

it("shortHash shows the first 12 hex digits", () => {
  expect(shortHash("0123456789abcdef".repeat(4))).toBe("0123456789ab…");
});
