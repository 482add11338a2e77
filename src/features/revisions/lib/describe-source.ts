/**
 * A table's `source` (generator parameters, upload, matched filter) in words for the revision page.
 * The server stores the source as loose JSON, so every field is read defensively.
 */
import { formatEng } from "@/lib/format";

type Json = Record<string, unknown>;

const num = (o: Json, k: string): number | undefined =>
  typeof o[k] === "number" ? (o[k] as number) : undefined;
const str = (o: Json, k: string): string | undefined =>
  typeof o[k] === "string" ? (o[k] as string) : undefined;
const obj = (o: Json, k: string): Json | undefined =>
  typeof o[k] === "object" && o[k] !== null && !Array.isArray(o[k]) ? (o[k] as Json) : undefined;
const eng = (v: number | undefined, unit: string) => (v === undefined ? "?" : formatEng(v, unit));

const WINDOW_NAMES: Record<string, string> = {
  rectangular: "rectangular",
  hann: "Hann",
  hamming: "Hamming",
  blackman: "Blackman",
  "blackman-harris": "Blackman-Harris",
  kaiser: "Kaiser",
  chebyshev: "Dolph-Chebyshev",
  taylor: "Taylor",
};

/** A window spec in words, e.g. `Taylor (n̄ = 5, -35 dB)`. */
export function windowWords(w: Json | undefined): string {
  if (!w) return "rectangular";
  const kind = str(w, "kind") ?? "?";
  const name = WINDOW_NAMES[kind] ?? kind;
  if (kind === "kaiser") return `${name} (β = ${num(w, "beta") ?? "?"})`;
  if (kind === "chebyshev") return `${name} (${num(w, "attenuationDb") ?? "?"} dB)`;
  if (kind === "taylor") return `${name} (n̄ = ${num(w, "nbar") ?? "?"}, ${num(w, "sidelobeDb") ?? "?"} dB)`;
  return name;
}

function codeWords(code: Json | undefined): string {
  if (!code) return "phase code";
  const kind = str(code, "kind") ?? "?";
  const label = kind === "barker" ? "Barker" : kind === "frank" ? "Frank" : kind.toUpperCase();
  const size = num(code, "length") ?? num(code, "order");
  return kind === "barker"
    ? `${label}-${size ?? "?"}`
    : `${label} ${code.order !== undefined ? "order" : "length"} ${size ?? "?"}`;
}

/** One line saying where a table's values came from; uploads are described by the caller (file + hash). */
export function describeSource(source: Json): string {
  const fs = `fs = ${eng(num(source, "sampleRateHz"), "Hz")}`;
  switch (source.kind) {
    case "lfm": {
      const ifHz = num(source, "intermediateFrequencyHz");
      const out =
        str(source, "output") === "real"
          ? `real${ifHz !== undefined ? ` at IF ${eng(ifHz, "Hz")}` : ""}`
          : "complex baseband";
      return `Linear FM ${str(source, "direction") === "down" ? "down" : "up"}-chirp, B = ${eng(num(source, "bandwidthHz"), "Hz")}, T = ${eng(num(source, "pulseWidthS"), "s")}, ${fs}, ${out}`;
    }
    case "nlfm":
      return `Nonlinear FM (stationary phase) shaped by a ${windowWords(obj(source, "window"))} spectrum, B = ${eng(num(source, "bandwidthHz"), "Hz")}, T = ${eng(num(source, "pulseWidthS"), "s")}, ${fs}`;
    case "phase-code": {
      const spc = num(source, "samplesPerChip") ?? 1;
      return `${codeWords(obj(source, "code"))} phase code, ${spc} sample${spc === 1 ? "" : "s"} per chip, ${fs}`;
    }
    case "matched-filter":
      return `Matched filter of ${str(source, "of") ?? "tx"}: h[n] = w[n]·conj(s[N−1−n]), ${windowWords(obj(source, "window"))} window`;
    case "design": {
      const band = str(source, "band") === "bandpass" ? "band-pass" : "low-pass";
      const edges =
        band === "low-pass"
          ? `cutoff ${eng(num(source, "cutoffHz"), "Hz")}`
          : `pass ${eng(num(source, "lowCutoffHz"), "Hz")} – ${eng(num(source, "highCutoffHz"), "Hz")}`;
      const taps = num(source, "taps");
      const win = obj(source, "window");
      return `Windowed-sinc ${band} FIR, ${edges}, transition ${eng(num(source, "transitionHz"), "Hz")}, ${num(source, "stopbandAttenuationDb") ?? "?"} dB stopband, ${win ? `${windowWords(win)} window` : "Kaiser window (Kaiser's formulas)"}${taps ? `, ${taps} taps` : ""}, ${fs}`;
    }
    case "upload":
      return `Uploaded file ${str(source, "fileName") ?? "?"}`;
    default:
      return `Source: ${String(source.kind ?? "unknown")}`;
  }
}

/** True when the table is a frequency-modulated pulse (or its matched filter), so instantaneous frequency is worth plotting. */
export function isFm(source: Json, txKind: string | undefined): boolean {
  if (source.kind === "lfm" || source.kind === "nlfm") return true;
  return source.kind === "matched-filter" && (txKind === "lfm" || txKind === "nlfm");
}
