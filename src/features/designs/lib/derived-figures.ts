/**
 * Figures an author wants to see while typing, before the server generates anything: sample count, time-bandwidth
 * product, range resolution, chips, FIR order and β, and plain-language warnings. Pure; SI units inside.
 */
import { MAX_SAMPLES } from "@shared/dsp/check";
import { kaiserBeta, kaiserOrder, WINDOW_MAINLOBE_FACTOR } from "@shared/dsp/fir-design";
import { windowWarnings } from "@shared/dsp/windows";
import { formatCount, formatEng } from "@/lib/format";
import type { DesignFormValues, PhaseCodeKind } from "./form-values";
import { phaseCodeSampleRateHz, toWindowSpec } from "./to-create-input";
import { given, mhzToHz, SPEED_OF_LIGHT, usToS } from "./units";

/** Beyond this many samples the analysis (FFTs of ≥ 2N−1 points, the sweep) takes long (common practice). */
export const LARGE_N = 1_048_576;

/** Samples in a pulse of width T at rate fs: round(T·fs), as the DSP core's generators count them. */
export const pulseSampleCount = (pulseWidthS: number, sampleRateHz: number): number =>
  Math.round(pulseWidthS * sampleRateHz);

/** Time-bandwidth product B·T (the compression ratio of a matched chirp). */
export const timeBandwidth = (bandwidthHz: number, pulseWidthS: number): number => bandwidthHz * pulseWidthS;

/** Range resolution c/(2B) in metres. */
export const rangeResolutionM = (bandwidthHz: number): number => SPEED_OF_LIGHT / (2 * bandwidthHz);

/** Chips of a phase code: Barker L, Frank/P1/P2 M², P3/P4 L. */
export function chipCount(
  code: PhaseCodeKind,
  p: { barkerLength: number; order: number; length: number },
): number {
  if (code === "barker") return p.barkerLength;
  if (code === "p3" || code === "p4") return p.length;
  return p.order * p.order;
}

/** Kaiser's β and order for a windowed-sinc FIR (O&S 1989, eqs. 7.92–7.93 via shared/dsp/fir-design.ts). */
export function kaiserEstimate(
  sampleRateHz: number,
  transitionHz: number,
  attenuationDb: number,
): { beta: number; order: number; taps: number } {
  const order = Math.max(2, kaiserOrder(attenuationDb, (2 * Math.PI * transitionHz) / sampleRateHz));
  return { beta: kaiserBeta(attenuationDb), order, taps: order + 1 };
}

/** Q notation of a word: signed W=16, F=15 → "Q1.15" (integer bits include the sign); unsigned → "UQ0.16". */
export function qFormat(wordLength: number, fractionLength: number, signed: boolean): string {
  if (!Number.isInteger(wordLength) || !Number.isInteger(fractionLength)) return "—";
  return `${signed ? "Q" : "UQ"}${wordLength - fractionLength}.${fractionLength}`;
}

/** One labelled figure. */
export interface Figure {
  label: string;
  value: string;
}

/** What the derived-figures panel shows. */
export interface Derived {
  figures: Figure[];
  warnings: string[];
}

const ok = (...xs: Array<number | undefined>) =>
  xs.every((x) => x !== undefined && Number.isFinite(x) && x > 0);

function sampleWarnings(n: number, warnings: string[]): void {
  if (n > MAX_SAMPLES)
    warnings.push(`${formatCount(n)} samples is more than the ${formatCount(MAX_SAMPLES)} allowed per table`);
  else if (n > LARGE_N)
    warnings.push(`${formatCount(n)} samples: analysis and plots of a table this long are slow`);
  else if (n < 1) warnings.push("the pulse is shorter than one sample");
}

function rxWindowWarnings(v: DesignFormValues, n: number, warnings: string[]): void {
  // windowWarnings builds a Chebyshev window to measure its edges: keep that cheap while typing.
  if (n < 1 || n > 65_536) return;
  try {
    warnings.push(...windowWarnings(toWindowSpec(v.rxWindow), n));
  } catch {
    // An out-of-range window parameter: the form shows the schema's message next to it instead.
  }
}

function chirpFigures(bandwidthHz: number, pulseWidthS: number, sampleRateHz: number, out: Derived): number {
  const n = pulseSampleCount(pulseWidthS, sampleRateHz);
  out.figures.push(
    { label: "Samples N", value: formatCount(n) },
    { label: "Time-bandwidth BT", value: formatCount(timeBandwidth(bandwidthHz, pulseWidthS)) },
    { label: "Range resolution c/2B", value: formatEng(rangeResolutionM(bandwidthHz), "m") },
    { label: "Oversampling fs/B", value: (sampleRateHz / bandwidthHz).toFixed(2) },
  );
  sampleWarnings(n, out.warnings);
  return n;
}

function waveformDerived(v: DesignFormValues, out: Derived): void {
  let n = 0;
  if (v.generator === "lfm" || v.generator === "nlfm") {
    const g = v.generator === "lfm" ? v.lfm : v.nlfm;
    const [b, t, fs] = [mhzToHz(g.bandwidthMHz), usToS(g.pulseWidthUs), mhzToHz(g.sampleRateMHz)];
    if (!ok(b, t, fs)) return;
    n = chirpFigures(b, t, fs, out);
    if (v.generator === "lfm" && v.lfm.output === "real") {
      const fIf =
        given(v.lfm.intermediateFrequencyMHz) === undefined ? NaN : mhzToHz(v.lfm.intermediateFrequencyMHz);
      if (!Number.isFinite(fIf)) out.warnings.push("a real chirp needs an intermediate frequency");
      else {
        if (fIf < b / 2) out.warnings.push("the IF is below B/2: the sweep would cross 0 Hz and fold over");
        if (fs < 2 * (fIf + b / 2))
          out.warnings.push(
            `undersampled: a real chirp up to ${formatEng(fIf + b / 2, "Hz")} needs fs ≥ ${formatEng(2 * (fIf + b / 2), "Hz")}`,
          );
      }
    } else if (fs < b)
      out.warnings.push(
        `undersampled: complex baseband needs fs ≥ B = ${formatEng(b, "Hz")}; the sweep aliases`,
      );
  } else {
    const p = v.phaseCode;
    const chips = chipCount(p.code, p);
    const fs = phaseCodeSampleRateHz(p);
    if (!ok(chips, p.samplesPerChip, fs)) return;
    const chipS = p.samplesPerChip / fs!;
    n = chips * p.samplesPerChip;
    out.figures.push(
      { label: "Chips", value: formatCount(chips) },
      { label: "Chip length", value: formatEng(chipS, "s") },
      { label: "Samples N", value: formatCount(n) },
      { label: "Range resolution cτ/2", value: formatEng((SPEED_OF_LIGHT * chipS) / 2, "m") },
      { label: "Sample rate", value: formatEng(fs!, "Hz") },
    );
    sampleWarnings(n, out.warnings);
    if (p.code === "p2" && p.order % 2 !== 0) out.warnings.push("P2 needs an even order");
  }
  rxWindowWarnings(v, n, out.warnings);
}

function filterDerived(v: DesignFormValues, out: Derived): void {
  const f = v.fir;
  const [fs, df, a] = [mhzToHz(f.sampleRateMHz), mhzToHz(f.transitionMHz), f.stopbandAttenuationDb];
  if (!ok(fs, df, a)) return;
  const nyq = fs / 2;
  const edges =
    f.band === "lowpass" ? [mhzToHz(f.cutoffMHz)] : [mhzToHz(f.lowCutoffMHz), mhzToHz(f.highCutoffMHz)];
  for (const e of edges)
    if (Number.isFinite(e) && (e - df / 2 <= 0 || e + df / 2 >= nyq))
      out.warnings.push(
        `${formatEng(e, "Hz")} ± half the transition leaves (0, fs/2 = ${formatEng(nyq, "Hz")})`,
      );
  if (f.band === "bandpass" && edges[0]! + df / 2 >= edges[1]! - df / 2)
    out.warnings.push("the passband is empty: widen the band or narrow the transition");
  if (df >= nyq || a <= 8) return;
  const est = kaiserEstimate(fs, df, a);
  const window = f.customWindow ? f.window.kind : "kaiser";
  const factor = WINDOW_MAINLOBE_FACTOR[window];
  let taps =
    given(f.taps) ??
    (factor !== undefined
      ? Math.max(2, Math.ceil((factor * Math.PI) / ((2 * Math.PI * df) / fs))) + 1
      : est.taps);
  if (given(f.taps) === undefined && f.customWindow && factor === undefined && window !== "kaiser") {
    out.warnings.push(`a ${window} window has no order formula: give the number of taps`);
    taps = NaN;
  }
  out.figures.push(
    { label: "Kaiser order M", value: formatCount(est.order) },
    { label: "Kaiser β", value: est.beta.toFixed(3) },
    { label: "Taps", value: Number.isFinite(taps) ? formatCount(taps) : "—" },
    { label: "Transition Δω", value: `${((2 * df) / fs).toFixed(4)}·π rad/sample` },
  );
  if (Number.isFinite(taps)) sampleWarnings(taps, out.warnings);
}

/** Figures and warnings for the generator part of the form (uploads: nothing to derive before the file is read). */
export function deriveFigures(v: DesignFormValues): Derived {
  const out: Derived = { figures: [], warnings: [] };
  if (v.source === "upload") return out;
  if (v.kind === "waveform") waveformDerived(v, out);
  else filterDerived(v, out);
  return out;
}
