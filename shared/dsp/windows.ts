/**
 * Spectral windows (tapers) for receive weighting, FIR design and NLFM spectrum shaping.
 *
 * Definitions follow F. J. Harris, "On the use of windows for harmonic analysis with the discrete
 * Fourier transform", Proc. IEEE 66(1):51–83, 1978 (cosine sums, Kaiser-Bessel, Dolph-Chebyshev), and
 * T. T. Taylor, "Design of line-source antennas for narrow beamwidth and low side lobes", IRE Trans.
 * Antennas Propag. AP-3:16–28, 1955 (Taylor F_m coefficients as given by W. G. Carrara, R. S. Goodman,
 * R. M. Majewski, "Spotlight Synthetic Aperture Radar", 1995, App. D).
 *
 * Symmetric windows (w[n] = w[N−1−n]) are the default, as used for FIR taps and receive weights.
 * The periodic form (for spectral analysis) is the symmetric window of N+1 points without its last one.
 */
import { checkFiniteNumber, checkInteger, checkRange, MAX_SAMPLES } from "./check";
import { fftInterleaved, nextPow2 } from "./fft";

/** A window kind with its parameters. */
export type WindowSpec =
  | { kind: "rectangular" }
  | { kind: "hann" }
  | { kind: "hamming" }
  | { kind: "blackman" }
  | { kind: "blackman-harris" }
  | { kind: "kaiser"; beta: number }
  | { kind: "chebyshev"; attenuationDb: number }
  | { kind: "taylor"; nbar: number; sidelobeDb: number };

/** Every window kind, in the order the UI lists them. */
export const WINDOW_KINDS = [
  "rectangular",
  "hann",
  "hamming",
  "blackman",
  "blackman-harris",
  "kaiser",
  "chebyshev",
  "taylor",
] as const satisfies readonly WindowSpec["kind"][];

/** Largest Kaiser β accepted: I0(β) stays well inside float64 (I0(100) ≈ 1e42). */
export const MAX_KAISER_BETA = 100;

// Cosine-sum coefficients a_k of w = Σ (−1)^k a_k cos(2πkn/(N−1)) — Harris 1978, eqs. (27a)–(27c), (30) and Table I.
const COSINE_SUMS: Record<string, readonly number[]> = {
  rectangular: [1],
  hann: [0.5, 0.5],
  hamming: [0.54, 0.46],
  blackman: [0.42, 0.5, 0.08],
  // 4-term, −92 dB (Harris 1978, p. 65)
  "blackman-harris": [0.35875, 0.48829, 0.14128, 0.01168],
};

/** Check a window spec's kind and parameters; throws TypeError/RangeError naming the field. */
export function checkWindowSpec(spec: WindowSpec, name = "window"): void {
  if (!spec || typeof spec !== "object") throw new TypeError(`${name} must be a window spec object`);
  switch (spec.kind) {
    case "rectangular":
    case "hann":
    case "hamming":
    case "blackman":
    case "blackman-harris":
      return;
    case "kaiser":
      checkRange(`${name}.beta`, spec.beta, 0, MAX_KAISER_BETA);
      return;
    case "chebyshev":
      checkRange(`${name}.attenuationDb`, spec.attenuationDb, 0, 300, { exclusiveMin: true });
      return;
    case "taylor":
      checkInteger(`${name}.nbar`, spec.nbar, 1, 1000);
      checkRange(`${name}.sidelobeDb`, spec.sidelobeDb, -300, 0, {});
      if (spec.sidelobeDb >= 0)
        throw new RangeError(`${name}.sidelobeDb must be negative, got ${spec.sidelobeDb}`);
      return;
    default:
      throw new TypeError(`${name}.kind is unknown: ${String((spec as { kind?: unknown }).kind)}`);
  }
}

/**
 * The window of `n` points, symmetric by default (`periodic: true` for the DFT-even form).
 * Rectangular/Hann/Hamming/Blackman/Blackman-Harris and Kaiser peak at exactly 1 (odd n);
 * Dolph-Chebyshev and Taylor are scaled so their centre (design point) is 1.
 */
export function makeWindow(spec: WindowSpec, n: number, opts?: { periodic?: boolean }): Float64Array {
  checkWindowSpec(spec);
  checkInteger("n", n, 1, MAX_SAMPLES);
  if (opts?.periodic) {
    if (n + 1 > MAX_SAMPLES)
      throw new RangeError(`n must be below ${MAX_SAMPLES} for a periodic window, got ${n}`);
    return symmetricWindow(spec, n + 1).slice(0, n);
  }
  return symmetricWindow(spec, n);
}

function symmetricWindow(spec: WindowSpec, n: number): Float64Array {
  if (n === 1) return Float64Array.of(1);
  let w: Float64Array;
  switch (spec.kind) {
    case "kaiser":
      w = kaiserWindow(spec.beta, n);
      break;
    case "chebyshev":
      w = chebyshevWindow(spec.attenuationDb, n);
      break;
    case "taylor":
      w = taylorWindow(spec.nbar, spec.sidelobeDb, n);
      break;
    default:
      w = cosineSum(COSINE_SUMS[spec.kind]!, n);
  }
  // Mirror the first half so w[n] = w[N−1−n] bit for bit: symmetric taps must quantize to symmetric codes.
  for (let i = 0; i < n >> 1; i++) w[n - 1 - i] = w[i]!;
  return w;
}

function cosineSum(a: readonly number[], n: number): Float64Array {
  const w = new Float64Array(n);
  const m = n - 1;
  for (let i = 0; i < n; i++) {
    let v = 0;
    for (let k = 0; k < a.length; k++)
      v += (k % 2 === 0 ? 1 : -1) * a[k]! * Math.cos((2 * Math.PI * k * i) / m);
    w[i] = v;
  }
  return w;
}

/**
 * Modified Bessel function of the first kind, order 0, by its power series Σ ((x/2)^k / k!)²
 * (Abramowitz & Stegun, Handbook of Mathematical Functions, 1964, eq. 9.6.12). Accurate to float64 for |x| ≤ 100.
 */
export function besselI0(x: number): number {
  checkFiniteNumber("x", x);
  const h = (x / 2) * (x / 2);
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 1000; k++) {
    term *= h / (k * k);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return sum;
}

// Kaiser-Bessel: w[n] = I0(β·√(1 − (2n/(N−1) − 1)²)) / I0(β) — Harris 1978 eq. (46) with β = πα.
function kaiserWindow(beta: number, n: number): Float64Array {
  const w = new Float64Array(n);
  const denom = besselI0(beta);
  for (let i = 0; i < n; i++) {
    const r = (2 * i) / (n - 1) - 1;
    w[i] = besselI0(beta * Math.sqrt(Math.max(0, 1 - r * r))) / denom;
  }
  return w;
}

/** Chebyshev polynomial T_m(x), valid for every real x (cosh form outside [−1, 1]). */
function chebyshevT(m: number, x: number): number {
  if (Math.abs(x) <= 1) return Math.cos(m * Math.acos(x));
  const v = Math.cosh(m * Math.acosh(Math.abs(x)));
  return x < 0 && m % 2 === 1 ? -v : v;
}

/**
 * Dolph-Chebyshev window: its DFT is W[k] = T_{N−1}(x0·cos(πk/N)), x0 = cosh(acosh(10^(A/20))/(N−1))
 * (Harris 1978 eq. (44)); the window is the inverse DFT of that equiripple spectrum. For even N the
 * half-sample delay e^{jπk/N} makes the samples real. Scaled so the centre is 1: for long windows the edge
 * samples can exceed the centre (see windowWarnings), and scaling by the peak would hide it.
 */
function chebyshevWindow(attenuationDb: number, n: number): Float64Array {
  const order = n - 1;
  const x0 = Math.cosh(Math.acosh(10 ** (attenuationDb / 20)) / order);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const p = chebyshevT(order, x0 * Math.cos((Math.PI * k) / n));
    if (n % 2 === 1) re[k] = p;
    else {
      // Half-sample shift so the inverse DFT is real and symmetric about (N−1)/2.
      re[k] = p * Math.cos((Math.PI * k) / n);
      im[k] = p * Math.sin((Math.PI * k) / n);
    }
  }
  const spectrum = dftAnyLength(re, im);
  // The DFT (not inverse) of the real, even spectrum gives the window folded about 0; unfold around the centre.
  const w = new Float64Array(n);
  if (n % 2 === 1) {
    const half = (n - 1) / 2;
    for (let i = 0; i <= half; i++) {
      w[half + i] = spectrum.re[i]!;
      w[half - i] = spectrum.re[i]!;
    }
  } else {
    const half = n / 2;
    for (let i = 0; i < half; i++) {
      w[half + i] = spectrum.re[i + 1]!;
      w[half - 1 - i] = spectrum.re[i + 1]!;
    }
  }
  const centre = n % 2 === 1 ? w[(n - 1) / 2]! : (w[n / 2 - 1]! + w[n / 2]!) / 2;
  for (let i = 0; i < n; i++) w[i] = w[i]! / centre;
  return w;
}

/**
 * Forward DFT of any length by Bluestein's chirp-z algorithm (L. I. Bluestein, "A linear filtering approach
 * to the computation of the discrete Fourier transform", IEEE Trans. Audio Electroacoust. 18(4), 1970),
 * so the Chebyshev window stays O(N log N) for long pulses.
 */
function dftAnyLength(re: Float64Array, im: Float64Array): { re: Float64Array; im: Float64Array } {
  const n = re.length;
  const size = nextPow2(2 * n - 1);
  // Chirp c[k] = e^{−jπk²/N}; k² mod 2N keeps the angle exact for large k.
  const cr = new Float64Array(n);
  const ci = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const a = (Math.PI * ((k * k) % (2 * n))) / n;
    cr[k] = Math.cos(a);
    ci[k] = -Math.sin(a);
  }
  const a = new Float64Array(2 * size);
  const b = new Float64Array(2 * size);
  for (let k = 0; k < n; k++) {
    a[2 * k] = re[k]! * cr[k]! - im[k]! * ci[k]!;
    a[2 * k + 1] = re[k]! * ci[k]! + im[k]! * cr[k]!;
    // b = conj(chirp), wrapped so that negative lags sit at the end.
    b[2 * k] = cr[k]!;
    b[2 * k + 1] = -ci[k]!;
    if (k > 0) {
      b[2 * (size - k)] = cr[k]!;
      b[2 * (size - k) + 1] = -ci[k]!;
    }
  }
  const fa = fftInterleaved(a);
  const fb = fftInterleaved(b);
  for (let k = 0; k < size; k++) {
    const xr = fa[2 * k]! * fb[2 * k]! - fa[2 * k + 1]! * fb[2 * k + 1]!;
    const xi = fa[2 * k]! * fb[2 * k + 1]! + fa[2 * k + 1]! * fb[2 * k]!;
    fa[2 * k] = xr;
    fa[2 * k + 1] = xi;
  }
  const conv = fftInterleaved(fa, true);
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const vr = conv[2 * k]!;
    const vi = conv[2 * k + 1]!;
    outRe[k] = vr * cr[k]! - vi * ci[k]!;
    outIm[k] = vr * ci[k]! + vi * cr[k]!;
  }
  return { re: outRe, im: outIm };
}

/** Taylor's A parameter for a sidelobe level (dB, negative): A = acosh(10^(−SLL/20))/π. */
export function taylorA(sidelobeDb: number): number {
  checkRange("sidelobeDb", sidelobeDb, -300, 0);
  return Math.acosh(10 ** (-sidelobeDb / 20)) / Math.PI;
}

/** Smallest n̄ meeting the rule n̄ ≥ 2A² + 0.5 that keeps the Taylor window monotonic (Carrara et al. 1995, from memory). */
export function taylorMinNbar(sidelobeDb: number): number {
  const a = taylorA(sidelobeDb);
  return Math.ceil(2 * a * a + 0.5);
}

/** Taylor's F_m coefficients, m = 1..n̄−1 (Carrara, Goodman, Majewski 1995, eq. D.16; Taylor 1955). */
export function taylorCoefficients(nbar: number, sidelobeDb: number): Float64Array {
  checkInteger("nbar", nbar, 1, 1000);
  const a = taylorA(sidelobeDb);
  // σ² stretches the ideal pattern's zeros so the n̄-th one lands on the uniform pattern's zero.
  const sigma2 = (nbar * nbar) / (a * a + (nbar - 0.5) * (nbar - 0.5));
  const f = new Float64Array(Math.max(0, nbar - 1));
  for (let m = 1; m < nbar; m++) {
    let num = 1;
    let den = 1;
    for (let i = 1; i < nbar; i++) {
      num *= 1 - (m * m) / (sigma2 * (a * a + (i - 0.5) * (i - 0.5)));
      if (i !== m) den *= 1 - (m * m) / (i * i);
    }
    f[m - 1] = ((m % 2 === 1 ? 1 : -1) * num) / (2 * den);
  }
  return f;
}

// w(x) = 1 + 2 Σ F_m cos(2πm x), x ∈ (−½, ½) at sample centres; scaled so w(0) = 1.
function taylorWindow(nbar: number, sidelobeDb: number, n: number): Float64Array {
  const f = taylorCoefficients(nbar, sidelobeDb);
  let centre = 1;
  for (let m = 0; m < f.length; m++) centre += 2 * f[m]!;
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = (i - (n - 1) / 2) / n;
    // cos(2π(m+1)x) by the Chebyshev recurrence cos((m+1)θ) = 2cos θ·cos(mθ) − cos((m−1)θ): one cos
    // per sample instead of n̄ − 1 (round-off grows about m·ε, far below any figure).
    const c1 = Math.cos(2 * Math.PI * x);
    let prev = 1;
    let cur = c1;
    let v = 1;
    for (let m = 0; m < f.length; m++) {
      v += 2 * f[m]! * cur;
      const next = 2 * c1 * cur - prev;
      prev = cur;
      cur = next;
    }
    w[i] = v / centre;
  }
  return w;
}

/**
 * Plain-language cautions about a window choice (empty when there are none): Dolph-Chebyshev edge spikes on
 * long windows, and a Taylor n̄ below the 2A² + 0.5 rule (non-monotonic taper).
 */
export function windowWarnings(spec: WindowSpec, n: number): string[] {
  checkWindowSpec(spec);
  checkInteger("n", n, 1, MAX_SAMPLES);
  const out: string[] = [];
  if (spec.kind === "chebyshev" && n > 2) {
    const w = makeWindow(spec, n);
    const edge = Math.max(Math.abs(w[0]!), Math.abs(w[n - 1]!));
    if (edge > 1)
      out.push(
        `Dolph-Chebyshev ${spec.attenuationDb} dB over ${n} samples: the edge samples are ${(20 * Math.log10(edge)).toFixed(1)} dB above the centre; use a Taylor window for long pulses`,
      );
  }
  if (spec.kind === "taylor") {
    const need = taylorMinNbar(spec.sidelobeDb);
    if (spec.nbar < need)
      out.push(
        `Taylor n̄ = ${spec.nbar} is below ${need} (2A² + 0.5) for ${spec.sidelobeDb} dB: the taper is not monotonic`,
      );
  }
  return out;
}
