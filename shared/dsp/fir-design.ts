/**
 * Linear-phase FIR design by the window method: the ideal (sinc) low-pass or band-pass response truncated to
 * M+1 taps and tapered by a window. Default window: Kaiser, with J. F. Kaiser's empirical formulas for β and the
 * order M (A. V. Oppenheim, R. W. Schafer, "Discrete-Time Signal Processing", 1989, §7.2, eqs. 7.92–7.93).
 * The cutoff is the centre of the transition band (the ≈ −6 dB point); taps are not rescaled, so the DC (or
 * band-centre) gain is 1 within the passband ripple, as the method gives.
 */
import { checkFiniteNumber, checkInteger, checkRange, MAX_SAMPLES } from "./check";
import { checkWindowSpec, makeWindow, type WindowSpec } from "./windows";

/** Kaiser's β for a stopband attenuation A = −20·log10 δ in dB (O&S 1989, eq. 7.92). */
export function kaiserBeta(attenuationDb: number): number {
  checkRange("attenuationDb", attenuationDb, 0, 300);
  const a = attenuationDb;
  if (a > 50) return 0.1102 * (a - 8.7);
  if (a >= 21) return 0.5842 * (a - 21) ** 0.4 + 0.07886 * (a - 21);
  return 0;
}

/** Kaiser's filter order M = ⌈(A − 8)/(2.285·Δω)⌉ for transition width Δω in rad/sample (O&S 1989, eq. 7.93). */
export function kaiserOrder(attenuationDb: number, transitionWidthRad: number): number {
  checkRange("attenuationDb", attenuationDb, 8, 300, { exclusiveMin: true });
  checkRange("transitionWidthRad", transitionWidthRad, 0, Math.PI, { exclusiveMin: true });
  return Math.ceil((attenuationDb - 8) / (2.285 * transitionWidthRad));
}

/**
 * Mainlobe width Δω·M/π of the fixed windows (O&S 1989, Table 7.1: rectangular 4π/(M+1), Hann and Hamming 8π/M,
 * Blackman 12π/M). Taking the transition band as wide as the mainlobe (common practice) sizes the filter when a fixed
 * window is chosen without a tap count.
 */
export const WINDOW_MAINLOBE_FACTOR: Readonly<Partial<Record<WindowSpec["kind"], number>>> = {
  rectangular: 4,
  hann: 8,
  hamming: 8,
  blackman: 12,
};

/** What to design; frequencies in Hz. Low-pass needs cutoffHz, band-pass lowCutoffHz and highCutoffHz. */
export interface FirDesignOptions {
  band: "lowpass" | "bandpass";
  sampleRateHz: number;
  cutoffHz?: number;
  lowCutoffHz?: number;
  highCutoffHz?: number;
  /** Width of each transition band, centred on its cutoff. */
  transitionHz: number;
  stopbandAttenuationDb: number;
  /** Kaiser(β from the attenuation) when absent. */
  window?: WindowSpec;
  /** Tap count (order + 1); by default from Kaiser's order formula (Kaiser window) or the window's mainlobe width. */
  taps?: number;
}

/** A designed filter: taps h[0..M], its order M and the Kaiser β used (null for another window). */
export interface FirDesign {
  taps: Float64Array;
  order: number;
  beta: number | null;
}

/** Design a linear-phase low-pass or band-pass FIR by the windowed-sinc method (see the module comment). */
export function designFir(opts: FirDesignOptions): FirDesign {
  if (!opts || typeof opts !== "object") throw new TypeError("designFir options must be an object");
  if (opts.band !== "lowpass" && opts.band !== "bandpass")
    throw new TypeError(`band must be "lowpass" or "bandpass", got ${String(opts.band)}`);
  checkRange("sampleRateHz", opts.sampleRateHz, 0, Number.MAX_VALUE, { exclusiveMin: true });
  const fs = opts.sampleRateHz;
  const nyq = fs / 2;
  checkRange("transitionHz", opts.transitionHz, 0, nyq, { exclusiveMin: true });
  checkRange("stopbandAttenuationDb", opts.stopbandAttenuationDb, 8, 300, { exclusiveMin: true });
  const half = opts.transitionHz / 2;

  // Edges of the ideal response in rad/sample, each with its transition band kept inside (0, π).
  const edges: number[] = [];
  const edge = (name: string, f: number | undefined) => {
    if (f === undefined) throw new RangeError(`${name} is required for a ${opts.band} filter`);
    checkFiniteNumber(name, f);
    if (f - half <= 0 || f + half >= nyq)
      throw new RangeError(
        `${name} ± transitionHz/2 must lie inside (0, sampleRateHz/2) = (0, ${nyq}), got ${f - half}..${f + half}`,
      );
    edges.push((2 * Math.PI * f) / fs);
  };
  if (opts.band === "lowpass") edge("cutoffHz", opts.cutoffHz);
  else {
    edge("lowCutoffHz", opts.lowCutoffHz);
    edge("highCutoffHz", opts.highCutoffHz);
    if (opts.lowCutoffHz! + half >= opts.highCutoffHz! - half)
      throw new RangeError(
        "highCutoffHz − lowCutoffHz must exceed transitionHz so the passband is not empty",
      );
  }

  const dw = (2 * Math.PI * opts.transitionHz) / fs;
  const a = opts.stopbandAttenuationDb;
  let window: WindowSpec;
  let beta: number | null = null;
  if (opts.window) {
    checkWindowSpec(opts.window);
    window = opts.window;
    if (window.kind === "kaiser") beta = window.beta;
  } else {
    beta = kaiserBeta(a);
    window = { kind: "kaiser", beta };
  }

  let order: number;
  if (opts.taps !== undefined) {
    checkInteger("taps", opts.taps, 2, MAX_SAMPLES);
    order = opts.taps - 1;
  } else {
    const factor = opts.window ? WINDOW_MAINLOBE_FACTOR[opts.window.kind] : undefined;
    if (opts.window && factor === undefined && opts.window.kind !== "kaiser")
      throw new RangeError(`taps is required with a ${opts.window.kind} window (no order formula for it)`);
    order = factor !== undefined ? Math.ceil((factor * Math.PI) / dw) : kaiserOrder(a, dw);
    order = Math.max(order, 2);
    if (order + 1 > MAX_SAMPLES)
      throw new RangeError(
        `transitionHz is too narrow: it needs ${order + 1} taps, at most ${MAX_SAMPLES} are allowed`,
      );
  }

  const w = makeWindow(window, order + 1);
  const taps = new Float64Array(order + 1);
  const mid = order / 2;
  // Compute the first half and mirror it, so the taps are exactly symmetric (linear phase survives quantization).
  for (let n = 0; n <= order / 2; n++) {
    const t = n - mid;
    // Ideal response: low-pass at ω_c is sin(ω_c t)/(πt); band-pass is the difference of two low-passes.
    const lp = (wc: number) => (t === 0 ? wc / Math.PI : Math.sin(wc * t) / (Math.PI * t));
    const ideal = edges.length === 1 ? lp(edges[0]!) : lp(edges[1]!) - lp(edges[0]!);
    taps[n] = ideal * w[n]!;
    taps[order - n] = taps[n]!;
  }
  return { taps, order, beta };
}
