/**
 * The ×U figures without the ×U grid: the compressed output is computed on the ×2 grid (two M-point
 * inverse transforms, `interpolateInto` with U = 2) and the ×U points are evaluated only where the
 * figures are decided, by band-limited interpolation of the ×2 grid:
 *  - the mainlobe (peak, first minima either side, its energy) on a local fine window;
 *  - the sidelobe peaks: every ×2 sample outside the mainlobe within CANDIDATE_RATIO of the largest
 *    one, plus the two samples at each mainlobe edge, get the fine points between their neighbours;
 *  - ISLR's total energy comes exactly from the spectrum (Parseval, `interpolatedEnergy`).
 *
 * Why ×2: the ×2 grid's spectrum is zero for 1/4 < |f| < 3/4 cycles per ×2 sample, so a short
 * windowed sinc with a transition band that wide (Kaiser, β = KAISER_BETA, ±KERNEL_HALF taps:
 * mainlobe half-width √(β²+π²)/(2π·K) ≈ 0.22) interpolates it to about 1e-10 of the local
 * amplitude (J. F. Kaiser, "Nonrecursive digital filter design using the I0-sinh window function",
 * 1974, for the window's spectrum; tests/unit/dsp/refine.test.ts checks against the full grid).
 *
 * The −3 dB width is refined the same way: the crossing between the two grid points that straddle
 * half power is found by bisection on the band-limited output itself, not by a straight line.
 */
import { interpolatedEnergy, interpolateInto, type InterpolationWorkspace } from "./compression";
import {
  findMainlobe,
  measureResponse,
  SPEED_OF_LIGHT,
  type MeasureOptions,
  type ResponseMetrics,
} from "./metrics";
import { besselI0 } from "./windows";

/** Half-length of the ×2-grid interpolation kernel, in ×2 samples. */
export const KERNEL_HALF = 20;
const KAISER_BETA = 28;
/** ×2 sidelobe samples at least this fraction of the largest one (power, −9 dB) are refined. */
export const CANDIDATE_RATIO = 1 / 8;

const I0_BETA = besselI0(KAISER_BETA);

/** Kernel value at distance x (×2 samples) from a grid point. */
function kernelAt(x: number): number {
  const z = x / KERNEL_HALF;
  if (Math.abs(z) >= 1) return 0;
  const sinc = x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x);
  return (sinc * besselI0(KAISER_BETA * Math.sqrt(1 - z * z))) / I0_BETA;
}

/** Taps for fraction φ ∈ [0, 1): k[t + K − 1] weighs grid point n0 + t, t = −K+1..K. */
function kernelFor(phi: number, out = new Float64Array(2 * KERNEL_HALF)): Float64Array {
  for (let t = -KERNEL_HALF + 1; t <= KERNEL_HALF; t++) out[t + KERNEL_HALF - 1] = kernelAt(phi - t);
  return out;
}

const kernelCache = new Map<number, Float64Array[]>();
/** Kernels for the fractions q/U of a ×2 sample, q = 0..U−1 (entry 0 unused). */
function kernelsFor(u: number): Float64Array[] {
  let k = kernelCache.get(u);
  if (!k) {
    k = [];
    for (let q = 0; q < u; q++) k.push(kernelFor(q / u));
    kernelCache.set(u, k);
  }
  return k;
}

/** The ×2 output of a product spectrum: interleaved complex values and |y|², 2M points each. */
export interface Grid2 {
  z: Float64Array;
  p: Float64Array;
}

/** Buffers reused across calls of the same M. */
export interface RefineWorkspace {
  interpolation?: InterpolationWorkspace;
  grid?: Grid2;
}

/** The ×2 output of an M-bin product spectrum (into the workspace's grid when it fits). */
export function grid2Of(spectrum: Float64Array, ws?: RefineWorkspace): Grid2 {
  const m = spectrum.length / 2;
  const g =
    ws?.grid && ws.grid.p.length === 2 * m
      ? ws.grid
      : { z: new Float64Array(4 * m), p: new Float64Array(2 * m) };
  interpolateInto(spectrum, 2, { y: g.z, power: g.p }, ws?.interpolation);
  return g;
}

/**
 * Reads the ×U grid from the ×2 grid: fine index j is ×2 position 2j/U (periodic in j over M·U).
 * `at(j)` writes re/im into `this.re`/`this.im` and returns |y|².
 */
export class FineGrid {
  re = 0;
  im = 0;
  readonly u: number;
  readonly size: number;
  private readonly n2: number;
  private readonly kernels: Float64Array[];
  private readonly scratch = new Float64Array(2 * KERNEL_HALF);
  constructor(
    readonly grid: Grid2,
    interpolation: number,
  ) {
    this.u = interpolation;
    this.n2 = grid.p.length;
    this.size = (this.n2 / 2) * interpolation;
    this.kernels = kernelsFor(interpolation);
  }

  /** |y|² at fine index j (any integer; taken modulo M·U). */
  at(j: number): number {
    const u = this.u;
    const jj = ((j % this.size) + this.size) % this.size;
    const n0 = Math.floor((2 * jj) / u);
    const q = 2 * jj - n0 * u;
    return q === 0 ? this.sample(n0) : this.interpolate(n0, this.kernels[q]!);
  }

  /** |y|² at fractional fine position t (band-limited, kernel built for the fraction). */
  atFraction(t: number): number {
    const x = (2 * t) / this.u;
    const n0 = Math.floor(x);
    const phi = x - n0;
    return phi === 0 ? this.sample(n0) : this.interpolate(n0, kernelFor(phi, this.scratch));
  }

  private sample(n0: number): number {
    const n = ((n0 % this.n2) + this.n2) % this.n2;
    this.re = this.grid.z[2 * n]!;
    this.im = this.grid.z[2 * n + 1]!;
    return this.grid.p[n]!;
  }

  private interpolate(n0: number, ker: Float64Array): number {
    const z = this.grid.z;
    const n2 = this.n2;
    let re = 0;
    let im = 0;
    let n = n0 - KERNEL_HALF + 1;
    if (n >= 0 && n0 + KERNEL_HALF < n2) {
      for (let t = 0, i = 2 * n; t < 2 * KERNEL_HALF; t++, i += 2) {
        const c = ker[t]!;
        re += c * z[i]!;
        im += c * z[i + 1]!;
      }
    } else {
      for (let t = 0; t < 2 * KERNEL_HALF; t++, n++) {
        const c = ker[t]!;
        const k = ((n % n2) + n2) % n2;
        re += c * z[2 * k]!;
        im += c * z[2 * k + 1]!;
      }
    }
    this.re = re;
    this.im = im;
    return re * re + im * im;
  }
}

/**
 * Where |y|² crosses `level` between fine points i (≥ level) and i + step (< level), by bisection on
 * the band-limited output (to 1e-9 of a fine step). Falls back to i at the grid's ends.
 */
export function bandLimitedCrossing(
  atFraction: (t: number) => number,
  powerAt: (j: number) => number,
  peak: number,
  level: number,
  step: 1 | -1,
  limit: number,
): number {
  let i = peak;
  while (i + step >= 0 && i + step < limit && powerAt(i + step) >= level) i += step;
  const j = i + step;
  if (j < 0 || j >= limit) return i;
  let a = 0; // fraction of the step from i: |y|² ≥ level at a, < level at b
  let b = 1;
  for (let k = 0; k < 34; k++) {
    const c = (a + b) / 2;
    if (atFraction(i + step * c) >= level) a = c;
    else b = c;
  }
  return i + step * ((a + b) / 2);
}

function widthOf(
  fine: FineGrid,
  powerAt: (j: number) => number,
  peak: number,
  peakPower: number,
  limit: number,
): number {
  const half = peakPower / 2;
  const at = (t: number) => fine.atFraction(t);
  return (
    (bandLimitedCrossing(at, powerAt, peak, half, 1, limit) -
      bandLimitedCrossing(at, powerAt, peak, half, -1, limit)) /
    fine.u
  );
}

function withWidth(m: ResponseMetrics, w: number, fs: number): ResponseMetrics {
  const seconds = w / fs;
  return {
    ...m,
    width3dbSamples: w,
    width3dbSeconds: seconds,
    width3dbMetres: (seconds * SPEED_OF_LIGHT) / 2,
  };
}

/** Result of `measureRefined`: the figures, the ×2 grid and a reader of the ×U grid. */
export interface RefinedMeasurement {
  metrics: ResponseMetrics;
  grid: Grid2;
  fine: FineGrid;
}

/**
 * The figures of the ×U output of a product spectrum, as `measureInterpolated` gives them on the full
 * grid (U ≤ 2: on the full grid itself), with the −3 dB width from the band-limited crossing.
 * `ws.grid` is overwritten (pass a fresh one to keep two results).
 */
export function measureRefined(
  spectrum: Float64Array,
  opts: MeasureOptions,
  ws?: RefineWorkspace,
): RefinedMeasurement {
  const u = opts.interpolation;
  const grid = grid2Of(spectrum, ws);
  const fine = new FineGrid(grid, u);
  const size = fine.size;
  if (u <= 2) {
    let power = grid.p;
    if (u === 1) {
      power = new Float64Array(grid.p.length / 2);
      for (let i = 0; i < power.length; i++) power[i] = grid.p[2 * i]!;
    }
    const m = measureResponse(power, opts);
    const peak = Math.round(m.peakPositionSamples * u);
    const w = widthOf(fine, (j) => power[j]!, peak, power[peak]!, size);
    return { metrics: withWidth(m, w, opts.sampleRateHz), grid, fine };
  }
  const p2 = grid.p;
  const n2 = p2.length;
  let peak2 = 0;
  for (let n = 1; n < n2; n++) if (p2[n]! > p2[peak2]!) peak2 = n;
  if (!(p2[peak2]! > 0)) throw new RangeError("compressed output is zero everywhere: no peak to measure");

  // Mainlobe on a fine window around the ×2 peak, widened until both first minima lie inside it.
  let half = 8;
  let win = new Float64Array(0);
  let start = 0;
  let lobe = { left: 0, right: 0 };
  let p = 0;
  for (;;) {
    start = Math.max(0, Math.floor(((peak2 - half) * u) / 2));
    const end = Math.min(size - 1, Math.ceil(((peak2 + half) * u) / 2));
    const len = end - start + 1;
    if (win.length !== len) win = new Float64Array(len);
    for (let i = 0; i < len; i++) win[i] = fine.at(start + i);
    p = 0;
    for (let i = 1; i < len; i++) if (win[i]! > win[p]!) p = i;
    lobe = findMainlobe(win, p);
    const clipped = (lobe.left === 0 && start > 0) || (lobe.right === len - 1 && end < size - 1);
    if (clipped && half < n2) {
      half *= 2;
      continue;
    }
    break;
  }
  const peakIndex = start + p;
  const peakPower = win[p]!;
  const lo = start + lobe.left;
  const hi = start + lobe.right;
  let mainE = 0;
  for (let i = lobe.left; i <= lobe.right; i++) mainE += win[i]!;
  const total = interpolatedEnergy(spectrum, u);

  // Sidelobes: ×2 samples outside the mainlobe (fine position n·U/2 outside [lo, hi]).
  const lo2 = (2 * lo) / u;
  const hi2 = (2 * hi) / u;
  let max2 = 0;
  for (let n = 0; n < n2; n++) {
    if (n >= lo2 && n <= hi2) continue;
    if (p2[n]! > max2) max2 = p2[n]!;
  }
  let maxSide = 0;
  const refineAround = (n: number) => {
    const from = Math.max(0, Math.ceil(((n - 1) * u) / 2));
    const to = Math.min(size - 1, Math.floor(((n + 1) * u) / 2));
    for (let j = from; j <= to; j++) {
      if (j >= lo && j <= hi) continue;
      const v = fine.at(j);
      if (v > maxSide) maxSide = v;
    }
  };
  const threshold = max2 * CANDIDATE_RATIO;
  for (let n = 0; n < n2; n++) {
    if (n >= lo2 && n <= hi2) continue;
    if (p2[n]! >= threshold) refineAround(n);
  }
  const l2 = Math.floor(lo2);
  const h2 = Math.ceil(hi2);
  for (const n of [l2, l2 - 1, h2, h2 + 1]) if (n >= 0 && n < n2) refineAround(n);

  const winAt = (j: number) => (j >= start && j < start + win.length ? win[j - start]! : fine.at(j));
  const w = widthOf(fine, winAt, peakIndex, peakPower, size);
  const seconds = w / opts.sampleRateHz;
  return {
    metrics: {
      peakAmplitude: Math.sqrt(peakPower),
      peakPositionSamples: peakIndex / u,
      peakOffsetSamples: (peakIndex - (opts.expectedIndex ?? peakIndex)) / u,
      pslDb: 10 * Math.log10(maxSide / peakPower),
      islrDb: 10 * Math.log10(Math.max(total - mainE, 0) / mainE),
      width3dbSamples: w,
      width3dbSeconds: seconds,
      width3dbMetres: (seconds * SPEED_OF_LIGHT) / 2,
      mainlobeSamples: { left: (lo - peakIndex) / u, right: (hi - peakIndex) / u },
    },
    grid,
    fine,
  };
}
