/** Time-left estimate and state wording for a running analysis. Pure, so the section and tests share it. */

/** Below this fraction the rate is mostly start-up noise: no estimate yet. */
const MIN_FRACTION = 0.03;

/**
 * Seconds left by linear extrapolation of the elapsed time (common practice): elapsed·(1 − p)/p.
 * Null while the job has not started, has too little progress to judge, or the clock looks wrong.
 */
export function secondsLeft(progress: number, startedAt: string | null, nowMs: number): number | null {
  if (!startedAt || !(progress >= MIN_FRACTION) || progress >= 1) return null;
  const started = Date.parse(startedAt);
  if (Number.isNaN(started)) return null;
  const elapsed = (nowMs - started) / 1000;
  if (elapsed <= 0) return null;
  return (elapsed * (1 - progress)) / progress;
}

/** What each DSP-core stage (shared/dsp/analysis.ts progress callbacks) means to a person. */
const STAGES: Record<string, string> = {
  // Set by the server's worker (server/services/analyses.ts) while it reads the revision and its tables.
  load: "Loading the revision",
  generate: "Generating the tables",
  quantize: "Quantizing",
  float: "Compressing the float reference",
  fixed: "Compressing the fixed-point tables",
  doppler: "Doppler cut",
  response: "Frequency response",
  sweep: "Bit-width sweep",
  done: "Writing the report",
};

/** A stage key as a sentence; unknown stages are shown as they came. */
export function stageLabel(stage: string | null | undefined): string {
  if (!stage) return "Waiting for a worker";
  return STAGES[stage] ?? stage;
}

/** Progress as a whole percentage, clamped to 0–100. */
export function percent(progress: number): number {
  if (!Number.isFinite(progress)) return 0;
  return Math.round(Math.min(1, Math.max(0, progress)) * 100);
}
