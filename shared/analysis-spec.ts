/**
 * Revision content + its stored tables → the DSP core's analysis spec. Generator sources stay as parameters
 * (the analysis regenerates them bit for bit); uploads become explicit `samples` (waveform) or `taps` (filter),
 * read from the revision's stored tables so the analysis sees exactly what was frozen at submission.
 */
import type { AnalysisSpecInput } from "./schemas/analysis";
import type { RevisionContent, TableRole } from "./schemas/designs";

/** One stored table's values. */
export interface TableValues {
  role: TableRole;
  re: ArrayLike<number>;
  im: ArrayLike<number>;
}

function values(tables: TableValues[], role: TableRole): { re: number[]; im?: number[] } {
  const t = tables.find((x) => x.role === role);
  if (!t) throw new RangeError(`the revision has no ${role} table`);
  if (t.re.length !== t.im.length)
    throw new RangeError(`${role}: re has ${t.re.length} values, im ${t.im.length}`);
  const re = Array.from(t.re);
  const im = Array.from(t.im);
  // A real table is passed without im, as the spec expects for real samples.
  return im.some((v) => v !== 0) ? { re, im } : { re };
}

/** How far below and above the table's own W the default sweep looks (common practice: ten bits below
 * reaches the word lengths where coefficient SQNR (about 6 dB a bit) and sidelobes give out for the usual limits). */
export const DEFAULT_SWEEP_BELOW = 10;
export const DEFAULT_SWEEP_ABOVE = 4;

/**
 * The bit-width sweep every analysis runs unless the revision sets its own: the swept table's W − 10 … W + 4,
 * inside the 2…32 bits a spec allows. The sweep varies the receive table of a waveform and the FIR taps.
 */
export function defaultSweep(content: RevisionContent): { minBits: number; maxBits: number } {
  const w =
    content.kind === "waveform" ? content.fixedPoint.rx.wordLength : content.fixedPoint.fir.wordLength;
  return {
    minBits: Math.max(2, Math.min(w, 32) - DEFAULT_SWEEP_BELOW),
    maxBits: Math.min(32, w + DEFAULT_SWEEP_ABOVE),
  };
}

/** The AnalysisSpec input for a revision (uploads replaced by their values; the default sweep when none is set). */
export function toAnalysisSpec(content: RevisionContent, tables: TableValues[]): AnalysisSpecInput {
  if (content.sweep === undefined) content = { ...content, sweep: defaultSweep(content) };
  if (content.kind === "waveform") {
    const { tx, ...rest } = content;
    if (tx.kind !== "upload") return { ...rest, tx };
    return { ...rest, tx: { kind: "samples", sampleRateHz: tx.sampleRateHz, ...values(tables, "tx") } };
  }
  const { fir, ...rest } = content;
  if (fir.kind !== "upload") return { ...rest, fir };
  return {
    ...rest,
    fir: {
      kind: "taps",
      sampleRateHz: fir.sampleRateHz,
      ...values(tables, "fir"),
      passbands: fir.passbands,
      stopbands: fir.stopbands,
    },
  };
}
