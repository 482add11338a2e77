// What-if: the change applied to a draft's content, the figures computed by the worker's function (the DSP
// core's analyze(), no second implementation), the comparison with the saved report, and the status helpers.
import { describe, expect, it } from "vitest";
import { analyze } from "@shared/dsp/analysis";
import { toAnalysisSpec } from "@shared/analysis-spec";
import { RevisionContentSchema, type RevisionContent } from "@shared/schemas/designs";
import { pollInterval, POLL_MS } from "@/features/analysis/api/get-analysis";
import { percent, secondsLeft, stageLabel } from "@/features/analysis/lib/progress";
import {
  applyChange,
  changesContent,
  compareFigures,
  currentChange,
  mainFigures,
  tableRolesOf,
} from "@/features/analysis/lib/what-if";
import { runWhatIf } from "@/features/analysis/lib/what-if-run";
import { windowOf, DEFAULT_WINDOW_PARAMS } from "@/features/analysis/lib/what-if-options";
import type { AnalysisStatus } from "@shared/schemas/analyses";

/** A draft: unweighted LFM, 2 MHz × 50 µs (BT = 100), fs = 5 MHz (N = 250), tx 16 bits, rx 12 bits. */
const lfm: RevisionContent = RevisionContentSchema.parse({
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 2e6, pulseWidthS: 50e-6, sampleRateHz: 5e6 },
  fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 12, fractionLength: 11 } },
  limits: { pslDbMax: -13, coefficientSqnrDbMin: 50 },
  sweep: { minBits: 6, maxBits: 16 },
  dopplerHz: 2000,
});

describe("applying a change", () => {
  it("changes only the chosen table's format and leaves the input alone", () => {
    const c = currentChange(lfm, "rx");
    expect(c.fixedPoint).toEqual({
      wordLength: 12,
      fractionLength: 11,
      rounding: "nearest-even",
      overflow: "saturate",
    });
    const next = applyChange(lfm, {
      ...c,
      fixedPoint: { ...c.fixedPoint, wordLength: 8, fractionLength: 7, rounding: "floor" },
    });
    expect(next.kind === "waveform" && next.fixedPoint.rx).toMatchObject({
      wordLength: 8,
      fractionLength: 7,
      rounding: "floor",
      scaling: "full-scale",
    });
    expect(next.kind === "waveform" && next.fixedPoint.tx).toEqual(
      lfm.kind === "waveform" && lfm.fixedPoint.tx,
    );
    expect(lfm.kind === "waveform" && lfm.fixedPoint.rx.wordLength).toBe(12);
    // The applied content is still valid for PATCH /api/revisions/:id.
    expect(RevisionContentSchema.safeParse(next).success).toBe(true);
    expect(changesContent(lfm, c)).toBe(false);
    expect(changesContent(lfm, { ...c, rxWindow: windowOf("taylor", DEFAULT_WINDOW_PARAMS) })).toBe(true);
    expect(tableRolesOf(lfm)).toEqual(["rx", "tx"]);
  });
});

describe("the worker's computation", () => {
  it("gives the saved report's figures when nothing changes (same DSP core, sweep and Doppler off)", () => {
    const saved = analyze(toAnalysisSpec(lfm, []));
    const preview = runWhatIf(lfm, []).figures;
    expect(preview).toEqual(mainFigures(saved));
  });

  it("moves the SQNR by about 6.02 dB per bit when W goes 12 → 8 (MT-229: SQNR = 6.02·B + 1.76 dB)", () => {
    const c = currentChange(lfm, "rx");
    const w12 = runWhatIf(lfm, []).figures;
    const w8 = runWhatIf(
      applyChange(lfm, { ...c, fixedPoint: { ...c.fixedPoint, wordLength: 8, fractionLength: 7 } }),
      [],
    ).figures;
    const drop = w12.coefficientSqnrDb! - w8.coefficientSqnrDb!;
    // Four bits: 24.08 dB; a 250-sample chirp is not an ideal sine, so ±1.5 dB.
    expect(drop).toBeGreaterThan(4 * 6.02 - 1.5);
    expect(drop).toBeLessThan(4 * 6.02 + 1.5);
    expect(w8.pslDb).not.toBe(w12.pslDb);
  });

  it("shows the unweighted LFM PSL near the finite-BT sinc figure −13.39 dB at BT = 100 (Richards 2014, eq. 4.99, derived)", () => {
    const f = runWhatIf(lfm, []).figures;
    // REFERENCES.md: −13.39 dB at BT = 100 from |χ(t)|; sampled at fs = 2.5·B and interpolated ×8: ±0.1 dB.
    expect(f.pslDb!).toBeGreaterThan(-13.39 - 0.1);
    expect(f.pslDb!).toBeLessThan(-13.39 + 0.1);
  });

  it("shows the Hamming receive weighting's mismatch loss of 1.34–1.35 dB (Richards 2014, p. 288)", () => {
    // Large BT so the window, not the finite pulse, sets the loss: 10 MHz × 50 µs, BT = 500.
    const wide = RevisionContentSchema.parse({
      ...lfm,
      tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 50e-6, sampleRateHz: 12.5e6 },
    });
    const c = currentChange(wide, "rx");
    const f = runWhatIf(
      applyChange(wide, {
        ...c,
        fixedPoint: { ...c.fixedPoint, wordLength: 16, fractionLength: 15 },
        rxWindow: { kind: "hamming" },
      }),
      [],
    ).figures;
    expect(f.mismatchLossDb!).toBeGreaterThan(1.33);
    expect(f.mismatchLossDb!).toBeLessThan(1.36);
  });

  it("counts the overflows of wrap at Q1.(W−1) where +1.0 does not fit (REFERENCES.md, common practice)", () => {
    const asGiven = RevisionContentSchema.parse({
      ...lfm,
      fixedPoint: {
        tx: { wordLength: 16, fractionLength: 15 },
        rx: { wordLength: 12, fractionLength: 11, scaling: "as-given", overflow: "wrap" },
      },
    });
    const f = runWhatIf(asGiven, []).figures;
    // The chirp's I (cos) starts at exactly +1.0 at t = 0 of the reversed, conjugated filter: at least one overflow.
    expect(f.overflowCount).toBeGreaterThan(0);
  });

  it("reports a bad change in words instead of throwing", () => {
    const bad = {
      ...lfm,
      fixedPoint: {
        ...(lfm.kind === "waveform" ? lfm.fixedPoint : {}),
        rx: { wordLength: 40, fractionLength: 39 },
      },
    } as RevisionContent;
    expect(() => runWhatIf(bad, [])).toThrow(/wordLength|32/);
  });
});

describe("comparison with the saved report", () => {
  it("gives preview − saved for each figure both sides have", () => {
    const rows = compareFigures(
      { pslDb: -13.4, islrDb: -9.7, coefficientSqnrDb: 70, overflowCount: 0, pass: true },
      { pslDb: -13.1, islrDb: null, coefficientSqnrDb: 46, overflowCount: 0, pass: false },
    );
    expect(rows.map((r) => [r.key, r.diff])).toEqual([
      ["pslDb", expect.closeTo(0.3, 12)],
      ["islrDb", null],
      ["coefficientSqnrDb", -24],
    ]);
    expect(compareFigures(null, { coefficientSqnrDb: 1, overflowCount: 0, pass: true })).toEqual([
      { key: "coefficientSqnrDb", label: "Coefficient SQNR", saved: null, preview: 1, diff: null },
    ]);
  });
});

describe("status helpers", () => {
  it("estimate time left by linear extrapolation: 25 % after 10 s → 30 s left (common practice)", () => {
    const now = Date.parse("2026-01-01T00:00:10Z");
    expect(secondsLeft(0.25, "2026-01-01T00:00:00Z", now)).toBe(30);
    expect(secondsLeft(0.5, "2026-01-01T00:00:00Z", now)).toBe(10);
    expect(secondsLeft(0.01, "2026-01-01T00:00:00Z", now)).toBeNull();
    expect(secondsLeft(0.5, null, now)).toBeNull();
    expect(secondsLeft(1, "2026-01-01T00:00:00Z", now)).toBeNull();
  });

  it("poll only while queued or running", () => {
    const base = {
      contentHash: "x",
      progress: 0,
      stage: null,
      error: null,
      queuedAt: "",
      startedAt: null,
      finishedAt: null,
      durationMs: null,
      softwareVersion: null,
      report: null,
    };
    const s = (state: AnalysisStatus["state"]): AnalysisStatus => ({ ...base, state });
    expect(pollInterval(s("queued"))).toBe(POLL_MS);
    expect(pollInterval(s("running"))).toBe(POLL_MS);
    expect(pollInterval(s("done"))).toBe(false);
    expect(pollInterval(s("failed"))).toBe(false);
    expect(pollInterval(null)).toBe(false);
  });

  it("word the stage and clamp the percentage", () => {
    expect(stageLabel("sweep")).toBe("Bit-width sweep");
    expect(stageLabel("something-new")).toBe("something-new");
    expect(stageLabel(null)).toBe("Waiting for a worker");
    expect([percent(-0.1), percent(0.456), percent(1.2), percent(Number.NaN)]).toEqual([0, 46, 100, 0]);
  });
});
