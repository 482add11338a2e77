/**
 * The what-if computation: the DSP core's own `analyze()` on the changed content (no second
 * implementation), without the bit-width sweep and the Doppler cut, which the preview does not show.
 * Runs inside workers/what-if.worker.ts; plain function so tests call it directly.
 */
import { analyze } from "@shared/dsp/analysis";
import { toAnalysisSpec } from "@shared/analysis-spec";
import type { RevisionContent } from "@shared/schemas/designs";
import { mainFigures, type MainFigures } from "./what-if";

/** Parameters of toAnalysisSpec's second argument: the revision's stored tables with their values. */
export type WhatIfTables = Parameters<typeof toAnalysisSpec>[1];

/** The figures of a changed content, and how long the DSP core took. */
export interface WhatIfResult {
  figures: MainFigures;
  elapsedMs: number;
}

/** Analyse `content` with the stored `tables` (uploads need their values), sweep and Doppler cut off. */
export function runWhatIf(content: RevisionContent, tables: WhatIfTables): WhatIfResult {
  const t0 = performance.now();
  const spec = { ...toAnalysisSpec(content, tables), sweep: undefined, dopplerHz: undefined };
  const report = analyze(spec);
  return { figures: mainFigures(report), elapsedMs: performance.now() - t0 };
}
