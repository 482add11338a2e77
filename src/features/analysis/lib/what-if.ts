/**
 * What-if on a draft: the author's changes (W, F, rounding, overflow, receive window) applied to the
 * revision content, and the handful of figures compared with the saved report. Pure and DSP-free, so the
 * page bundle stays small; the computation itself runs in workers/what-if.worker.ts.
 */
import type { AnalysisReport } from "@shared/dsp/analysis";
import type { FixedPointSpec } from "@shared/dsp/types";
import type { WindowSpecSchema } from "@shared/schemas/analysis";
import type { RevisionContent, TableRole } from "@shared/schemas/designs";
import type { z } from "zod";

type WindowSpec = z.infer<typeof WindowSpecSchema>;

/** The knobs of the what-if panel: one table's format, and the receive window (waveforms). */
export interface WhatIfChange {
  table: TableRole;
  fixedPoint: Pick<FixedPointSpec, "wordLength" | "fractionLength" | "rounding" | "overflow">;
  rxWindow?: WindowSpec;
}

/** The tables whose format an author can change in this content. */
export function tableRolesOf(content: RevisionContent): TableRole[] {
  return content.kind === "waveform" ? ["rx", "tx"] : ["fir"];
}

/** The current settings of one table, as the panel starts from. */
export function currentChange(content: RevisionContent, table: TableRole): WhatIfChange {
  const fp = fixedPointOf(content, table);
  const change: WhatIfChange = {
    table,
    fixedPoint: {
      wordLength: fp.wordLength,
      fractionLength: fp.fractionLength,
      rounding: fp.rounding,
      overflow: fp.overflow,
    },
  };
  if (content.kind === "waveform") change.rxWindow = content.rx.window;
  return change;
}

function fixedPointOf(content: RevisionContent, table: TableRole): FixedPointSpec {
  const fp =
    content.kind === "waveform"
      ? table === "tx"
        ? content.fixedPoint.tx
        : content.fixedPoint.rx
      : content.fixedPoint.fir;
  return fp;
}

/** The content with the change applied (a new object; the input is left alone). */
export function applyChange(content: RevisionContent, change: WhatIfChange): RevisionContent {
  const merged = { ...fixedPointOf(content, change.table), ...change.fixedPoint };
  if (content.kind === "waveform") {
    const fixedPoint =
      change.table === "tx" ? { ...content.fixedPoint, tx: merged } : { ...content.fixedPoint, rx: merged };
    return { ...content, fixedPoint, rx: change.rxWindow ? { window: change.rxWindow } : content.rx };
  }
  return { ...content, fixedPoint: { fir: merged } };
}

/** True when the change would alter the content (so "Apply to draft" has something to save). */
export function changesContent(content: RevisionContent, change: WhatIfChange): boolean {
  return JSON.stringify(applyChange(content, change)) !== JSON.stringify(content);
}

/** The figures the what-if panel shows. */
export interface MainFigures {
  pslDb?: number | null;
  islrDb?: number | null;
  mismatchLossDb?: number | null;
  peakLossDb?: number | null;
  /** Worst table; null = exactly representable. */
  coefficientSqnrDb: number | null;
  stopbandAttenuationDb?: number | null;
  passbandRippleDb?: number | null;
  overflowCount: number;
  pass: boolean;
}

/** The main figures of a report (fixed point; the SQNR of the worst table). */
export function mainFigures(report: Pick<AnalysisReport, "kind" | "fixed" | "tables" | "pass">): MainFigures {
  let worst: number | null = null;
  let overflow = 0;
  for (const t of report.tables) {
    overflow += t.overflowCount;
    if (t.coefficientSqnrDb !== null && (worst === null || t.coefficientSqnrDb < worst))
      worst = t.coefficientSqnrDb;
  }
  const f = report.fixed;
  const common = { coefficientSqnrDb: worst, overflowCount: overflow, pass: report.pass };
  if (report.kind === "filter") {
    return {
      ...common,
      stopbandAttenuationDb: f.stopbandAttenuationDb ?? null,
      passbandRippleDb: f.passbandRippleDb ?? null,
    };
  }
  return {
    ...common,
    pslDb: f.pslDb ?? null,
    islrDb: f.islrDb ?? null,
    mismatchLossDb: f.mismatchLossDb ?? null,
    peakLossDb: f.peakLossDb ?? null,
  };
}

/** One line of the saved-vs-what-if comparison. */
export interface FigureComparison {
  key: keyof MainFigures;
  label: string;
  saved: number | null;
  preview: number | null;
  /** preview − saved, dB; null when either side is missing or infinite. */
  diff: number | null;
}

const LABELS: ReadonlyArray<[keyof MainFigures, string]> = [
  ["pslDb", "PSL"],
  ["islrDb", "ISLR"],
  ["mismatchLossDb", "Mismatch loss"],
  ["peakLossDb", "Peak loss"],
  ["coefficientSqnrDb", "Coefficient SQNR"],
  ["stopbandAttenuationDb", "Stopband attenuation"],
  ["passbandRippleDb", "Passband ripple"],
];

/** Saved vs preview, for the figures either side has. */
export function compareFigures(saved: MainFigures | null, preview: MainFigures | null): FigureComparison[] {
  const out: FigureComparison[] = [];
  for (const [key, label] of LABELS) {
    const a = saved ? (saved[key] as number | null | undefined) : undefined;
    const b = preview ? (preview[key] as number | null | undefined) : undefined;
    if (a === undefined && b === undefined) continue;
    const s = a ?? null;
    const p = b ?? null;
    out.push({ key, label, saved: s, preview: p, diff: s === null || p === null ? null : p - s });
  }
  return out;
}
