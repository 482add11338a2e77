/**
 * Bit-width sweep of a waveform pair: the compression figures for every word length W, computed cheaply.
 *
 * What is reused: the float output on the full ×U grid (computed once by the analysis) and the spectrum of
 * every table that the sweep does not vary (by default the transmit table). Per W, only the varied
 * table is quantized and transformed, and one M-point inverse FFT gives the coarse (U = 1) output over the
 * whole range. The ×U figures are then refined only where they are decided:
 *  - the fixed output is the float one plus a small difference Δ = y_fixed − y_float (known exactly on
 *    the coarse grid); on the fine grid we use y_float (exact) + Δ interpolated locally with a
 *    Kaiser-windowed sinc of ±KERNEL_HALF taps, so the error is a small fraction of Δ, not of y;
 *  - that refined grid is evaluated around the mainlobe (peak, first minima, −3 dB points) and around
 *    the strongest coarse and float sidelobes (PSL candidates);
 *  - ISLR's total energy comes exactly from the spectrum (Parseval), so only the mainlobe sum is local.
 * The smallest passing W and its neighbour below are then recomputed in full (confirmed), so the answer
 * does not rest on the refinement. tests/unit/dsp/sweep.test.ts bounds refined − full.
 */
import { fftInterleaved } from "./fft";
import { interpolatedEnergy } from "./compression";
import {
  findMainlobe,
  halfPowerCrossing,
  measureInterpolated,
  SPEED_OF_LIGHT,
  type MeasureWorkspace,
  type ResponseMetrics,
} from "./metrics";
import { bandLimitedCrossing, measureRefined, type FineGrid, type RefineWorkspace } from "./refine";
import { besselI0 } from "./windows";

/** Half-length of the local interpolation kernel of Δ, in coarse samples. */
export const KERNEL_HALF = 24;
/** How many coarse and float sidelobe peaks are refined as PSL candidates. */
export const PSL_CANDIDATES = 24;
const KAISER_BETA = 8; // common practice for windowed-sinc interpolators (≈ −80 dB kernel sidelobes)

/** The Δ kernel at distance x (coarse samples) from a coarse point: sinc·Kaiser over ±(K+1). */
function deltaKernelAt(x: number, i0b: number): number {
  const sinc = x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x);
  const z = x / (KERNEL_HALF + 1);
  const w = Math.abs(z) >= 1 ? 0 : besselI0(KAISER_BETA * Math.sqrt(1 - z * z)) / i0b;
  return sinc * w;
}

/** Kernels k_r[t] = sinc(t − r/U)·kaiser, t = −K+1..K, for each fractional offset r = 1..U−1. */
function interpolationKernels(u: number): Float64Array[] {
  const kernels: Float64Array[] = [];
  const k = KERNEL_HALF;
  const i0b = besselI0(KAISER_BETA);
  for (let r = 0; r < u; r++) {
    const ker = new Float64Array(2 * k);
    // distance from coarse sample n0+t to the fine point n0 + r/U
    for (let t = -k + 1; t <= k; t++) ker[t + k - 1] = deltaKernelAt(r / u - t, i0b);
    kernels.push(ker);
  }
  return kernels;
}

/** What the sweep reuses from the float analysis. */
export interface SweepReference {
  /** Float output on the ×U grid, interleaved (M·U points); or `floatGrid`, its reader from the ×2 grid. */
  floatFine?: Float64Array;
  /** The float output's ×U points read from its ×2 grid (shared/dsp/refine.ts); used when floatFine is absent. */
  floatGrid?: FineGrid;
  floatMetrics: ResponseMetrics;
  /** Transform size M and interpolation U. */
  size: number;
  interpolation: number;
  sampleRateHz: number;
  /** Fine index where the target's peak belongs: U·(N−1). */
  expectedIndex: number;
  /** |floatFine|² when already computed (saves a pass and a buffer). */
  floatPower?: Float64Array;
  /** Buffers the full recomputations may overwrite (e.g. the fixed output's, once it has been used). */
  workspace?: MeasureWorkspace & RefineWorkspace;
}

/** Precomputed per reference: kernels, the coarse float output and the float PSL candidates. */
export interface SweepContext extends SweepReference {
  kernels: Float64Array[];
  floatCoarse: Float64Array;
  floatCandidates: number[];
  /** Float value at fine index j (any integer, periodic): writes re/im into `floatAt.re/im`. */
  floatAt: ((j: number) => void) & { re: number; im: number };
  /** Per-W scratch (coarse output, Δ, its power), reused by every `refinedResponse` call. */
  scratch: { coarse: Float64Array; delta: Float64Array; power: Float64Array };
}

/**
 * Top `count` indices of local maxima of `p` outside [lo, hi] (a full slot list is replaced at its first
 * smallest entry; the minimum is rescanned only on a replacement, since only a larger value can enter).
 */
function topLocalMaxima(p: Float64Array, lo: number, hi: number, count: number): number[] {
  const bi: number[] = [];
  const bv: number[] = [];
  let minV = Infinity;
  let minAt = -1;
  const length = p.length;
  const rescan = () => {
    minAt = 0;
    for (let s = 1; s < bv.length; s++) if (bv[s]! < bv[minAt]!) minAt = s;
    minV = bv[minAt]!;
  };
  for (let i = 1; i + 1 < length; i++) {
    const v = p[i]!;
    if (!(v > minV) && bi.length === count) continue;
    if (i >= lo && i <= hi) continue;
    if (v < p[i - 1]! || v < p[i + 1]! || v === 0) continue;
    if (bi.length < count) {
      bi.push(i);
      bv.push(v);
      if (bi.length === count) rescan();
      continue;
    }
    bi[minAt] = i;
    bv[minAt] = v;
    rescan();
  }
  return bi;
}

/** |z|² of interleaved data (into `out` when given). */
function powerOfInterleaved(z: Float64Array, out?: Float64Array): Float64Array {
  const n = z.length / 2;
  const p = out ?? new Float64Array(n);
  for (let i = 0; i < n; i++) p[i] = z[2 * i]! * z[2 * i]! + z[2 * i + 1]! * z[2 * i + 1]!;
  return p;
}

/** Build the reusable context once per analysis. */
export function prepareSweep(ref: SweepReference): SweepContext {
  const u = ref.interpolation;
  const m = ref.size;
  const big = m * u;
  const floatAt = (() => {
    const ff = ref.floatFine;
    const fg = ref.floatGrid;
    const at = (j: number) => {
      if (ff) {
        const jj = ((j % big) + big) % big;
        at.re = ff[2 * jj]!;
        at.im = ff[2 * jj + 1]!;
      } else {
        fg!.at(j);
        at.re = fg!.re;
        at.im = fg!.im;
      }
    };
    at.re = 0;
    at.im = 0;
    return at;
  })();
  if (!ref.floatFine && !ref.floatGrid) throw new RangeError("the sweep needs floatFine or floatGrid");
  const floatCoarse = new Float64Array(2 * m);
  for (let n = 0; n < m; n++) {
    floatAt(n * u);
    floatCoarse[2 * n] = floatAt.re;
    floatCoarse[2 * n + 1] = floatAt.im;
  }
  const peak = ref.floatMetrics.peakPositionSamples * u;
  const lo = peak + ref.floatMetrics.mainlobeSamples.left * u;
  const hi = peak + ref.floatMetrics.mainlobeSamples.right * u;
  let floatCandidates: number[];
  if (ref.floatFine) {
    const pf = ref.floatPower ?? powerOfInterleaved(ref.floatFine);
    floatCandidates = topLocalMaxima(pf, lo, hi, PSL_CANDIDATES).map((i) => Math.round(i / u));
  } else {
    // ×2 grid: index n is fine index n·U/2, coarse sample n/2.
    const p2 = ref.floatGrid!.grid.p;
    floatCandidates = topLocalMaxima(p2, (2 * lo) / u, (2 * hi) / u, PSL_CANDIDATES).map((n) =>
      Math.round(n / 2),
    );
  }
  const scratch = {
    coarse: new Float64Array(2 * m),
    delta: new Float64Array(2 * m),
    power: new Float64Array(m),
  };
  return { ...ref, kernels: interpolationKernels(u), floatCoarse, floatCandidates, floatAt, scratch };
}

/**
 * Refined ×U figures of a fixed-point product spectrum (M bins). Equal to the full computation when
 * U = 1; otherwise within the tolerances tests/unit/dsp/sweep.test.ts states.
 */
export function refinedResponse(ctx: SweepContext, spectrum: Float64Array): ResponseMetrics {
  const u = ctx.interpolation;
  const m = ctx.size;
  const { scratch, floatAt } = ctx;
  const coarse = fftInterleaved(spectrum, true, scratch.coarse);
  const delta = scratch.delta;
  for (let i = 0; i < 2 * m; i++) delta[i] = coarse[i]! - ctx.floatCoarse[i]!;
  const k = KERNEL_HALF;
  // |y_fixed|² at fine index j: float (exact) + Δ (exact at coarse points, locally interpolated between).
  const fineP = (j: number): number => {
    const n0 = Math.floor(j / u);
    const r = j - n0 * u;
    let dr: number;
    let di: number;
    if (r === 0) {
      const n = ((n0 % m) + m) % m;
      dr = delta[2 * n]!;
      di = delta[2 * n + 1]!;
    } else {
      const ker = ctx.kernels[r]!;
      dr = 0;
      di = 0;
      if (n0 - k + 1 >= 0 && n0 + k < m) {
        for (let t = 0, i = 2 * (n0 - k + 1); t < 2 * k; t++, i += 2) {
          const c = ker[t]!;
          dr += c * delta[i]!;
          di += c * delta[i + 1]!;
        }
      } else {
        for (let t = -k + 1; t <= k; t++) {
          const n = (((n0 + t) % m) + m) % m;
          const c = ker[t + k - 1]!;
          dr += c * delta[2 * n]!;
          di += c * delta[2 * n + 1]!;
        }
      }
    }
    floatAt(j);
    const re = floatAt.re + dr;
    const im = floatAt.im + di;
    return re * re + im * im;
  };
  const pc = powerOfInterleaved(coarse, scratch.power);
  let cPeak = 0;
  for (let n = 1; n < m; n++) if (pc[n]! > pc[cPeak]!) cPeak = n;
  // Mainlobe on a fine window around the coarse peak, widened until both first minima lie inside it.
  let half = Math.max(
    4,
    Math.ceil(Math.max(-ctx.floatMetrics.mainlobeSamples.left, ctx.floatMetrics.mainlobeSamples.right)) + 2,
  );
  for (;;) {
    const start = (cPeak - half) * u;
    const len = 2 * half * u + 1;
    const win = new Float64Array(len);
    for (let i = 0; i < len; i++) win[i] = fineP(start + i);
    let p = 0;
    for (let i = 1; i < len; i++) if (win[i]! > win[p]!) p = i;
    const lobe = findMainlobe(win, p);
    if ((lobe.left === 0 || lobe.right === len - 1) && half < m / 2) {
      half *= 2;
      continue;
    }
    const peakP = win[p]!;
    let mainE = 0;
    for (let i = lobe.left; i <= lobe.right; i++) mainE += win[i]!;
    const total = interpolatedEnergy(spectrum, u);
    const lo = start + lobe.left;
    const hi = start + lobe.right;
    // PSL: every coarse sidelobe sample is exact; candidates get the fine points between their neighbours.
    let maxSide = 0;
    for (let n = 0; n < m; n++) {
      const j = n * u;
      if (j >= lo && j <= hi) continue;
      if (pc[n]! > maxSide) maxSide = pc[n]!;
    }
    const coarseCandidates = topLocalMaxima(pc, Math.floor(lo / u), Math.ceil(hi / u), PSL_CANDIDATES);
    const seen = new Set<number>();
    for (const n of [...coarseCandidates, ...ctx.floatCandidates]) {
      for (let j = (n - 1) * u + 1; j < (n + 1) * u; j++) {
        if ((j >= lo && j <= hi) || seen.has(j)) continue;
        seen.add(j);
        const v = fineP(j);
        if (v > maxSide) maxSide = v;
      }
    }
    const hp = peakP / 2;
    let width: number;
    const fg = ctx.floatGrid;
    if (fg) {
      // Band-limited crossing: float (exact, from its ×2 grid) + Δ interpolated at the fraction.
      const i0b = besselI0(KAISER_BETA);
      const atFraction = (t: number): number => {
        const x = t / u;
        const n0 = Math.floor(x);
        let dr = 0;
        let di = 0;
        for (let q = -k + 1; q <= k; q++) {
          const n = (((n0 + q) % m) + m) % m;
          const c = deltaKernelAt(x - n0 - q, i0b);
          dr += c * delta[2 * n]!;
          di += c * delta[2 * n + 1]!;
        }
        fg.atFraction(t);
        const re = fg.re + dr;
        const im = fg.im + di;
        return re * re + im * im;
      };
      const winAt = (j: number) => (j >= start && j < start + len ? win[j - start]! : fineP(j));
      const lim = m * u;
      width =
        (bandLimitedCrossing(atFraction, winAt, start + p, hp, 1, lim) -
          bandLimitedCrossing(atFraction, winAt, start + p, hp, -1, lim)) /
        u;
    } else {
      width = (halfPowerCrossing(win, p, hp, 1) - halfPowerCrossing(win, p, hp, -1)) / u;
    }
    const seconds = width / ctx.sampleRateHz;
    const peakIndex = start + p;
    return {
      peakAmplitude: Math.sqrt(peakP),
      peakPositionSamples: peakIndex / u,
      peakOffsetSamples: (peakIndex - ctx.expectedIndex) / u,
      pslDb: 10 * Math.log10(maxSide / peakP),
      islrDb: 10 * Math.log10(Math.max(total - mainE, 0) / mainE),
      width3dbSamples: width,
      width3dbSeconds: seconds,
      width3dbMetres: (seconds * SPEED_OF_LIGHT) / 2,
      mainlobeSamples: { left: (lo - peakIndex) / u, right: (hi - peakIndex) / u },
    };
  }
}

/**
 * The full computation for one product spectrum (the reference the refinement is checked against):
 * `measureRefined`, which gives the whole-grid figures (shared/dsp/refine.ts), or with `grid: "full"`
 * the whole ×U grid itself.
 */
export function fullResponse(
  ctx: SweepReference,
  spectrum: Float64Array,
  grid: "refined" | "full" = "refined",
): ResponseMetrics {
  const opts = {
    interpolation: ctx.interpolation,
    sampleRateHz: ctx.sampleRateHz,
    expectedIndex: ctx.expectedIndex,
  };
  if (grid === "refined") return measureRefined(spectrum, opts, ctx.workspace).metrics;
  return measureInterpolated(spectrum, opts, {
    complex: false,
    ...(ctx.workspace ? { workspace: ctx.workspace } : {}),
  }).metrics;
}

/** One row of a sweep. */
export interface SweepRow<T> {
  wordLength: number;
  figures: T;
  pass: boolean;
  /** "refined": ×U figures from the local refinement; "full": recomputed on the whole ×U grid. */
  method: "refined" | "full" | "exact";
}

/**
 * Smallest W whose row passes, confirmed by `full` at that W and at W−1: rows are recomputed in full
 * until a passing full row sits directly above a failing one (or the range end). Returns null when none passes.
 */
export function confirmSmallest<T>(
  rows: SweepRow<T>[],
  full: (wordLength: number) => { figures: T; pass: boolean },
): number | null {
  const confirm = (i: number) => {
    const row = rows[i]!;
    if (row.method === "refined") {
      const f = full(row.wordLength);
      rows[i] = { wordLength: row.wordLength, figures: f.figures, pass: f.pass, method: "full" };
    }
    return rows[i]!.pass;
  };
  let i = rows.findIndex((r) => r.pass);
  if (i < 0) {
    // Refinement said nothing passes: the widest W decides (confirm it; if it passes, walk down).
    i = rows.length - 1;
    if (!confirm(i)) return null;
  }
  for (;;) {
    if (!confirm(i)) {
      i++;
      while (i < rows.length && !rows[i]!.pass) i++;
      if (i >= rows.length) return null;
      continue;
    }
    if (i === 0 || !confirm(i - 1)) return rows[i]!.wordLength;
    i--;
  }
}
