// The report page's pure helpers: rows, chips, plots, wording and number formats, fed by the DSP core's own
// analyze() (no second implementation) and checked against published figures and exact arithmetic.
import { describe, expect, it } from "vitest";
import { analyze, type AnalysisReport } from "@shared/dsp/analysis";
import { assumptions } from "@/features/analysis/lib/assumptions";
import { chipText, formatDiff, formatMetric } from "@/features/analysis/lib/format-metric";
import { limitChips, metricRows } from "@/features/analysis/lib/metric-rows";
import { sweepPlots, tracePlots } from "@/features/analysis/lib/report-plots";

const Q16 = { wordLength: 16, fractionLength: 15 };

/**
 * Barker-13, one sample per chip, matched (rectangular) receive filter, measured on the sample grid (U = 1):
 * Richards' figures are at whole-chip lags; ×8 interpolation would add the ripple between chips.
 */
const barker = analyze({
  kind: "waveform",
  interpolation: 1,
  tx: { kind: "phase-code", code: { kind: "barker", length: 13 }, sampleRateHz: 1e6 },
  fixedPoint: { tx: Q16, rx: Q16 },
  limits: { pslDbMax: -20, islrDbMax: -30, coefficientSqnrDbMin: 60 },
  dopplerHz: 1000,
});

/** Unweighted LFM, 2 MHz × 50 µs (BT = 100), fs = 2.5 MHz, rx at 8 bits, swept 4–12. */
const lfm = analyze({
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 2e6, pulseWidthS: 50e-6, sampleRateHz: 2.5e6 },
  fixedPoint: { tx: Q16, rx: { wordLength: 8, fractionLength: 7 } },
  limits: { pslDbMax: -13, coefficientSqnrDbMin: 45 },
  sweep: { minBits: 4, maxBits: 12 },
});

describe("metric rows", () => {
  it("show the Barker-13 PSL of 20·log10(1/13) = −22.28 dB for float and fixed (Richards 2014, Table 4.1)", () => {
    const rows = metricRows(barker);
    const psl = rows.find((r) => r.key === "pslDb")!;
    expect(psl.float).toBeCloseTo(20 * Math.log10(1 / 13), 2);
    // ±1 chips are exact at 16 bits full-scale, so fixed = float and the difference is 0.
    expect(psl.fixed).toBeCloseTo(psl.float!, 9);
    expect(psl.diff).toBeCloseTo(0, 9);
    expect(psl.check).toMatchObject({ name: "pslDbMax", limit: -20, pass: true });
    expect(formatMetric(psl.fixed, "dB")).toBe("-22.28 dB");
  });

  it("report 0 dB mismatch loss for the unweighted matched filter (DESIGN.md definition)", () => {
    const row = metricRows(barker).find((r) => r.key === "mismatchLossDb")!;
    expect(row.float).toBeCloseTo(0, 9);
  });

  it("give one SQNR row per table, 'exact' for exactly representable ±1 chips", () => {
    const rows = metricRows(barker).filter((r) => r.key.startsWith("sqnr-"));
    expect(rows.map((r) => r.key)).toEqual(["sqnr-tx", "sqnr-rx"]);
    expect(rows.every((r) => r.fixed === null && r.check?.pass === true)).toBe(true);
    expect(formatMetric(rows[0]!.fixed, "dB", "exact")).toBe("exact");
  });

  it("carry the report's figures unchanged and judge each limit as the report does", () => {
    for (const r of metricRows(lfm)) {
      if (r.key.startsWith("sqnr-")) continue;
      expect(r.float).toBe(lfm.float[r.key] ?? null);
      expect(r.fixed).toBe(lfm.fixed[r.key] ?? null);
    }
    const psl = metricRows(lfm).find((r) => r.key === "pslDb")!;
    expect(psl.check?.pass).toBe(lfm.limits.find((c) => c.name === "pslDbMax")!.pass);
  });
});

describe("limit chips", () => {
  it("put the compression limits on the receive table and an SQNR chip on every table", () => {
    const groups = limitChips(barker);
    expect(groups.map((g) => g.table)).toEqual(["tx", "rx"]);
    expect(groups[0]!.chips.map((c) => c.label)).toEqual(["Coefficient SQNR"]);
    expect(groups[1]!.chips.map((c) => c.label)).toEqual(["PSL", "ISLR", "Coefficient SQNR"]);
  });

  it("say the verdict and the comparison in words", () => {
    const psl = limitChips(barker)[1]!.chips[0]!;
    expect(chipText(psl)).toBe("PSL -22.28 dB ≤ -20.00 dB");
    const sqnr = limitChips(barker)[0]!.chips[0]!;
    expect(chipText(sqnr)).toBe("Coefficient SQNR exact ≥ 60.00 dB");
  });

  it("pass the SQNR chip of an 8-bit chirp against 45 dB: about 6.02·8 + 1.76 = 49.9 dB (MT-229)", () => {
    // MT-229 (Kester): SQNR = 6.02·B + 1.76 dB for a full-scale sine; a sampled chirp's I/Q follow a sine's
    // amplitude law (REFERENCES.md, derived). A 125-sample chirp at 8 bits is not an ideal sine: measured
    // 51.06 dB, so the check allows ±1.5 dB.
    const rx = lfm.tables.find((t) => t.role === "rx")!;
    expect(rx.coefficientSqnrDb!).toBeGreaterThan(6.02 * 8 + 1.76 - 1.5);
    expect(rx.coefficientSqnrDb!).toBeLessThan(6.02 * 8 + 1.76 + 1.5);
    expect(limitChips(lfm)[1]!.chips.find((c) => c.label === "Coefficient SQNR")!.pass).toBe(true);
  });
});

describe("plots", () => {
  it("overlay float (signal) and fixed (copper) with the PSL limit line, peak at 0 dB at zero delay", () => {
    const plots = tracePlots(lfm);
    expect(plots.map((p) => p.key)).toEqual(["compressed", "mainlobe", "spectrum", "lsb-tx", "lsb-rx"]);
    const main = plots[1]!;
    expect(main.series.map((s) => [s.label, s.tone])).toEqual([
      ["Float", "signal"],
      ["Fixed", "copper"],
      ["PSL limit", "warn"],
    ]);
    // dB re the float peak: the float trace is 0 dB at the target's delay (x = 0) by definition.
    const at0 = Array.from(main.x.values).indexOf(0);
    expect(main.series[0]!.values[at0]).toBe(0);
    expect(main.series[2]!.values.every((v) => v === -13)).toBe(true);
  });

  it("draw the sweep with its limits and mark the smallest passing W", () => {
    const plots = sweepPlots(lfm);
    expect(plots.map((p) => p.key)).toEqual(["sweep-sidelobes", "sweep-losses", "sweep-sqnr"]);
    const sq = plots[2]!;
    expect(Array.from(sq.x.values)).toEqual([4, 5, 6, 7, 8, 9, 10, 11, 12]);
    expect(Array.from(sq.series[0]!.values)).toEqual(lfm.sweep!.rows.map((r) => r.figures.coefficientSqnrDb));
    expect(sq.series[1]!.values.every((v) => v === 45)).toBe(true);
    expect(sq.markers).toEqual([
      { x: lfm.sweep!.smallestPassingWordLength!, label: `W = ${lfm.sweep!.smallestPassingWordLength}` },
    ]);
    // SQNR grows about 6.02 dB per bit (MT-229): between W = 6 and W = 12, 36.1 ± 2 dB.
    const s = lfm.sweep!.rows;
    expect(s[8]!.figures.coefficientSqnrDb! - s[2]!.figures.coefficientSqnrDb!).toBeGreaterThan(6 * 6.02 - 2);
    expect(s[8]!.figures.coefficientSqnrDb! - s[2]!.figures.coefficientSqnrDb!).toBeLessThan(6 * 6.02 + 2);
  });

  it("draw a filter's stopband limit as a mask below the passband", () => {
    const fir = analyze({
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
      limits: { stopbandAttenuationDbMin: 55 },
    });
    const [resp] = tracePlots(fir);
    expect(resp!.key).toBe("response");
    const mask = resp!.series.at(-1)!;
    expect(mask.label).toBe("Stopband mask");
    // Stopband from cutoff + transition/2 = 15 MHz (docs/analysis.md): NaN (a gap) below, −55 dB from there on.
    const xs = resp!.x.values;
    expect(resp!.x.unit).toBe("MHz");
    for (let i = 0; i < xs.length; i++)
      expect(Number.isNaN(mask.values[i]!) ? "gap" : mask.values[i]).toBe(xs[i]! >= 15 ? -55 : "gap");
    // Attenuation of a 60 dB Kaiser design: within 1 dB of 60 (O&S eqs. 7.92–7.93 design target).
    expect(fir.float.stopbandAttenuationDb!).toBeGreaterThan(59);
  });
});

describe("wording and formats", () => {
  it("state interpolation, white noise and the Doppler value's role", () => {
    const text = assumptions(barker as AnalysisReport).join(" ");
    expect(assumptions(lfm).join(" ")).toContain("U = 8");
    expect(text).toContain("U = 1");
    expect(text).toContain("white noise");
    expect(text).toContain("Doppler");
  });

  it("print dB with two decimals and signed differences", () => {
    expect(formatMetric(-13.2649, "dB")).toBe("-13.26 dB");
    expect(formatDiff(0.354, "dB")).toBe("+0.35 dB");
    expect(formatDiff(-0.004, "dB")).toBe("0.00 dB");
    expect(formatDiff(-1.5, "dB")).toBe("-1.50 dB");
    // c/2 · 1/B for B = 2 MHz: 74.9 m (Richards ch. 4, range resolution).
    expect(formatMetric(299_792_458 / 2 / 2e6, "m")).toBe("74.95 m");
  });
});
