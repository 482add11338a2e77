import type { Verification } from "@shared/schemas/verifications";

/** The newest run of each vector set (runs arrive newest first). */
export function latestPerSet(runs: readonly Verification[]): Map<string, Verification> {
  const out = new Map<string, Verification>();
  for (const r of runs) if (!out.has(r.vectorSet)) out.set(r.vectorSet, r);
  return out;
}

/** "(12, −3)": a complex integer sample as the tables show it. */
export function sampleText(s: { re: number; im: number }): string {
  const n = (v: number) => (v < 0 ? `\u2212${-v}` : String(v));
  return `(${n(s.re)}, ${n(s.im)})`;
}
