/**
 * How the report writes a table's word and gain, the same on the report page (client) and in the printed
 * report (server/reports/render-html.ts), so the two never disagree ("1" against "0.999969").
 */

/** The fields of a fixed-point spec this module reads. */
export interface WordSpec {
  wordLength: number;
  fractionLength: number;
  signed: boolean;
}

/** Q notation with the sign, integer bits counting the sign bit: signed W 16, F 15 → "sQ1.15"; unsigned → "uQ0.16". */
export function qNotation(f: WordSpec): string {
  return `${f.signed ? "s" : "u"}Q${f.wordLength - f.fractionLength}.${f.fractionLength}`;
}

/** The word in full: "sQ1.15 (signed, W = 16, F = 15)". */
export function wordText(f: WordSpec): string {
  return `${qNotation(f)} (${f.signed ? "signed" : "unsigned"}, W = ${f.wordLength}, F = ${f.fractionLength})`;
}

/** A scaling gain to six significant figures, trailing zeros dropped: 0.99996948 → "0.999969", 1 → "1". */
export function gainText(g: number): string {
  if (!Number.isFinite(g)) return "\u2014";
  return String(Number(g.toPrecision(6)));
}
