/**
 * Exact complex integer convolution in O(L log L): number-theoretic transforms modulo several primes
 * below 2^26.5 and Chinese-remainder reconstruction in BigInt.
 *
 * Why it is exact: every residue product a·b with a, b < p < 2^26.5 is an integer below 2^53, so float64
 * holds it exactly, and `a·b − ⌊a·b/p⌋·p` (quotient estimated in float64, then corrected by at most one p)
 * is exactly a·b mod p. The transforms therefore compute y mod p exactly for each prime p. With
 * B = max|x| · Σ(|h_re| + |h_im|) ≥ |y[n]| for every output (triangle inequality), primes are taken until
 * their product P exceeds 2B + 1; the centred CRT residue in (−P/2, P/2] is then y[n] itself.
 * Reference: Garner's mixed-radix CRT (Knuth, TAOCP vol. 2, 3rd ed., 1997, §4.3.2) and the cyclic
 * convolution theorem over Z/pZ (Pollard, "The fast Fourier transform in a finite field", Math. Comp. 25, 1971).
 */

/** Integer I/Q samples (exact integers in float64 or plain arrays). */
export interface IntegerPairs {
  re: ArrayLike<number>;
  im: ArrayLike<number>;
}

/** Exact complex integer accumulators, one per output. */
export interface ExactAccumulators {
  re: bigint[];
  im: bigint[];
}

/** Longest transform (2^20); longer convolutions are cut into blocks that each fit (overlap-add, exact). */
export const MAX_TRANSFORM_LOG2 = 20;

/** Primes stay below this so that a product of two residues is below 2^53 (exact in float64). */
const PRIME_LIMIT = Math.floor(2 ** 26.5);

interface PrimeField {
  p: number;
  pInv: number;
  /** Primitive root of unity of order 2^MAX_TRANSFORM_LOG2. */
  root: number;
}

function mulMod(a: number, b: number, p: number, pInv: number): number {
  const x = a * b;
  let r = x - Math.floor(x * pInv) * p;
  if (r < 0) r += p;
  else if (r >= p) r -= p;
  return r;
}

function powMod(b: number, e: number, p: number, pInv: number): number {
  let r = 1;
  let base = b % p;
  while (e > 0) {
    if (e % 2 === 1) r = mulMod(r, base, p, pInv);
    base = mulMod(base, base, p, pInv);
    e = Math.floor(e / 2);
  }
  return r;
}

function isPrime(n: number): boolean {
  if (n < 2) return false;
  for (let d = 2; d * d <= n; d++) if (n % d === 0) return false;
  return true;
}

function primeFactors(n: number): number[] {
  const out: number[] = [];
  for (let d = 2; d * d <= n; d++) {
    if (n % d === 0) {
      out.push(d);
      while (n % d === 0) n /= d;
    }
  }
  if (n > 1) out.push(n);
  return out;
}

let fields: PrimeField[] | undefined;

/** Primes p = c·2^20 + 1 < 2^26.5, largest first, each with a root of unity of order 2^20. */
export function nttPrimes(): readonly PrimeField[] {
  if (fields) return fields;
  const out: PrimeField[] = [];
  const step = 2 ** MAX_TRANSFORM_LOG2;
  for (let c = Math.floor((PRIME_LIMIT - 1) / step); c >= 1; c--) {
    const p = c * step + 1;
    if (!isPrime(p)) continue;
    const pInv = 1 / p;
    const factors = primeFactors(p - 1);
    let g = 2;
    while (!factors.every((f) => powMod(g, (p - 1) / f, p, pInv) !== 1)) g++;
    out.push({ p, pInv, root: powMod(g, (p - 1) / step, p, pInv) });
  }
  fields = out;
  return out;
}

/** In-place iterative radix-2 NTT of length 2^log2 (inverse: root⁻¹ and a 1/L scale). */
function ntt(a: Float64Array, log2: number, f: PrimeField, inverse: boolean): void {
  const n = a.length;
  const { p, pInv } = f;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      const t = a[i]!;
      a[i] = a[j]!;
      a[j] = t;
    }
  }
  let w0 = powMod(f.root, 2 ** (MAX_TRANSFORM_LOG2 - log2), p, pInv);
  if (inverse) w0 = powMod(w0, p - 2, p, pInv);
  // Twiddles of the last stage; stage s uses every (n / len)-th.
  const half = n >> 1;
  const tw = new Float64Array(Math.max(1, half));
  tw[0] = 1;
  for (let i = 1; i < half; i++) tw[i] = mulMod(tw[i - 1]!, w0, p, pInv);
  for (let len = 2; len <= n; len <<= 1) {
    const h = len >> 1;
    const stride = n / len;
    for (let s = 0; s < n; s += len) {
      for (let k = 0; k < h; k++) {
        const u = a[s + k]!;
        const v = mulMod(a[s + k + h]!, tw[k * stride]!, p, pInv);
        const x = u + v;
        const y = u - v;
        a[s + k] = x >= p ? x - p : x;
        a[s + k + h] = y < 0 ? y + p : y;
      }
    }
  }
  if (inverse) {
    const nInv = powMod(n % p, p - 2, p, pInv);
    for (let i = 0; i < n; i++) a[i] = mulMod(a[i]!, nInv, p, pInv);
  }
}

function residues(src: ArrayLike<number>, n: number, p: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < src.length; i++) {
    const r = src[i]! % p;
    out[i] = r < 0 ? r + p : r + 0;
  }
  return out;
}

function largestMagnitude(x: IntegerPairs): number {
  let m = 0;
  for (let i = 0; i < x.re.length; i++) m = Math.max(m, Math.abs(x.re[i]!), Math.abs(x.im[i]!));
  return m;
}

function checkIntegers(name: string, x: IntegerPairs): void {
  if (x.re.length !== x.im.length) throw new RangeError(`${name}: re and im differ in length`);
  for (const part of [x.re, x.im])
    for (let i = 0; i < part.length; i++)
      if (!Number.isSafeInteger(part[i]!))
        throw new RangeError(`${name}: element ${i} is not a safe integer (${part[i]})`);
}

/**
 * The full convolution y[n] = Σ_k h[k]·x[n−k] (Nx + Nh − 1 outputs) of complex integer sequences, exact:
 * y_re = Σ (h_re·x_re − h_im·x_im), y_im = Σ (h_re·x_im + h_im·x_re). Sequences whose convolution is
 * longer than one transform are cut into blocks of x and h; each block pair is convolved exactly and
 * added at its offset in BigInt (convolution is bilinear, so the sum is the whole convolution).
 */
export function exactComplexConvolution(
  x: IntegerPairs,
  h: IntegerPairs,
  opts: { transformLog2?: number } = {},
): ExactAccumulators {
  checkIntegers("x", x);
  checkIntegers("h", h);
  const nx = x.re.length;
  const nh = h.re.length;
  if (nx === 0 || nh === 0) return { re: [], im: [] };
  // Tests shorten the transform to exercise the blocks on small inputs.
  const maxL = 2 ** Math.min(MAX_TRANSFORM_LOG2, Math.max(1, opts.transformLog2 ?? MAX_TRANSFORM_LOG2));
  if (nx + nh - 1 <= maxL) return convolveBlock(x, h);
  // Blocks of half a transform each, so every block pair fits in one.
  const block = maxL / 2;
  const ny = nx + nh - 1;
  const re = new Array<bigint>(ny).fill(0n);
  const im = new Array<bigint>(ny).fill(0n);
  const slice = (s: IntegerPairs, a: number) => ({
    re: Array.prototype.slice.call(s.re, a, a + block) as number[],
    im: Array.prototype.slice.call(s.im, a, a + block) as number[],
  });
  for (let a = 0; a < nx; a += block) {
    const xb = slice(x, a);
    for (let b = 0; b < nh; b += block) {
      const part = convolveBlock(xb, slice(h, b));
      for (let n = 0; n < part.re.length; n++) {
        re[a + b + n] = re[a + b + n]! + part.re[n]!;
        im[a + b + n] = im[a + b + n]! + part.im[n]!;
      }
    }
  }
  return { re, im };
}

function convolveBlock(x: IntegerPairs, h: IntegerPairs): ExactAccumulators {
  const nx = x.re.length;
  const nh = h.re.length;
  if (nx === 0 || nh === 0) return { re: [], im: [] };
  const ny = nx + nh - 1;
  let log2 = 0;
  while (2 ** log2 < ny) log2++;
  if (log2 > MAX_TRANSFORM_LOG2)
    throw new RangeError(
      `the convolution needs ${ny} outputs; at most 2^${MAX_TRANSFORM_LOG2} are supported`,
    );
  const L = 2 ** log2;

  let sumH = 0n;
  for (let k = 0; k < nh; k++) sumH += BigInt(Math.abs(h.re[k]!)) + BigInt(Math.abs(h.im[k]!));
  const bound = BigInt(largestMagnitude(x)) * sumH;
  const all = nttPrimes();
  const used: PrimeField[] = [];
  let P = 1n;
  for (const f of all) {
    if (P > 2n * bound + 1n) break;
    used.push(f);
    P *= BigInt(f.p);
  }
  if (P <= 2n * bound + 1n) throw new RangeError("the accumulators are too wide for the available primes");

  // Residues of y_re and y_im modulo each prime.
  const yRe: Float64Array[] = [];
  const yIm: Float64Array[] = [];
  for (const f of used) {
    const { p, pInv } = f;
    const xr = residues(x.re, L, p);
    const xi = residues(x.im, L, p);
    const hr = residues(h.re, L, p);
    const hi = residues(h.im, L, p);
    for (const a of [xr, xi, hr, hi]) ntt(a, log2, f, false);
    for (let i = 0; i < L; i++) {
      const rr = mulMod(hr[i]!, xr[i]!, p, pInv);
      const ii = mulMod(hi[i]!, xi[i]!, p, pInv);
      const ri = mulMod(hr[i]!, xi[i]!, p, pInv);
      const ir = mulMod(hi[i]!, xr[i]!, p, pInv);
      const re = rr - ii;
      const im = ri + ir;
      xr[i] = re < 0 ? re + p : re;
      xi[i] = im >= p ? im - p : im;
    }
    ntt(xr, log2, f, true);
    ntt(xi, log2, f, true);
    yRe.push(xr);
    yIm.push(xi);
  }

  // Garner: mixed-radix digits d_i (each < p_i), then y = d_0 + p_0(d_1 + p_1(d_2 + …)), centred.
  const k = used.length;
  const inv: number[][] = used.map((fi, i) =>
    used.map((fj, j) => (j < i ? powMod(fj.p % fi.p, fi.p - 2, fi.p, fi.pInv) : 0)),
  );
  const bigP = used.map((f) => BigInt(f.p));
  const halfP = P / 2n;
  const digits = new Float64Array(k);
  const reconstruct = (res: Float64Array[], n: number): bigint => {
    for (let i = 0; i < k; i++) {
      const { p, pInv } = used[i]!;
      let t = res[i]![n]!;
      for (let j = 0; j < i; j++) {
        let d = t - (digits[j]! % p);
        if (d < 0) d += p;
        t = mulMod(d, inv[i]![j]!, p, pInv);
      }
      digits[i] = t;
    }
    let v = BigInt(digits[k - 1]!);
    for (let i = k - 2; i >= 0; i--) v = v * bigP[i]! + BigInt(digits[i]!);
    return v > halfP ? v - P : v;
  };
  const re = new Array<bigint>(ny);
  const im = new Array<bigint>(ny);
  for (let n = 0; n < ny; n++) {
    re[n] = reconstruct(yRe, n);
    im[n] = reconstruct(yIm, n);
  }
  return { re, im };
}
