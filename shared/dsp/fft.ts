/**
 * Thin wrapper over fft.js (radix-4, power-of-two sizes) with cached plans.
 * Interleaved Float64Array layout [re0, im0, re1, im1, …] is the fast path; the ComplexSignal helpers
 * copy into it. The inverse is scaled by 1/N (fft.js convention), so ifft(fft(x)) = x.
 */
import FFT from "fft.js";
import { checkInteger, MAX_SAMPLES } from "./check";
import type { ComplexSignal } from "./types";

const plans = new Map<number, FFT>();

function plan(size: number): FFT {
  let p = plans.get(size);
  if (!p) {
    p = new FFT(size);
    plans.set(size, p);
  }
  return p;
}

/** Smallest power of two ≥ n (n ≥ 1); fft.js needs sizes ≥ 2. */
export function nextPow2(n: number): number {
  checkInteger("n", n, 1, 2 ** 30);
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/** Largest transform the core will plan (2^26 points = 1 GiB of interleaved doubles at worst). */
export const MAX_FFT_SIZE = 2 ** 26;

function checkSize(size: number) {
  checkInteger("fft size", size, 2, MAX_FFT_SIZE);
  if ((size & (size - 1)) !== 0) throw new RangeError(`fft size must be a power of two, got ${size}`);
}

/**
 * Forward (or inverse) transform of interleaved complex data of `size` points.
 * Writes into `out` when given (must differ from `data`), else allocates.
 */
export function fftInterleaved(data: Float64Array, inverse = false, out?: Float64Array): Float64Array {
  const size = data.length / 2;
  checkSize(size);
  const result = out ?? new Float64Array(data.length);
  if (result === data) throw new RangeError("fftInterleaved: out must not be the input buffer");
  if (result.length !== data.length) throw new RangeError("fftInterleaved: out has the wrong length");
  const p = plan(size);
  if (inverse) p.inverseTransform(result, data);
  else p.transform(result, data);
  return result;
}

/** Interleave a signal into a zero-padded buffer of `size` complex points. */
export function toInterleaved(s: ComplexSignal, size: number, out?: Float64Array): Float64Array {
  if (s.re.length > size)
    throw new RangeError(`signal of ${s.re.length} samples does not fit ${size} points`);
  const buf = out ?? new Float64Array(2 * size);
  if (out) buf.fill(0);
  for (let i = 0; i < s.re.length; i++) {
    buf[2 * i] = s.re[i]!;
    buf[2 * i + 1] = s.im[i]!;
  }
  return buf;
}

/** Split interleaved data back into a ComplexSignal (first `length` points). */
export function fromInterleaved(buf: Float64Array, length = buf.length / 2): ComplexSignal {
  const re = new Float64Array(length);
  const im = new Float64Array(length);
  for (let i = 0; i < length; i++) {
    re[i] = buf[2 * i]!;
    im[i] = buf[2 * i + 1]!;
  }
  return { re, im };
}

/** DFT of a signal zero-padded to `size` (default: next power of two ≥ its length). */
export function fft(s: ComplexSignal, size = nextPow2(Math.max(2, s.re.length))): ComplexSignal {
  if (s.re.length > MAX_SAMPLES)
    throw new RangeError(`signal has ${s.re.length} samples; at most ${MAX_SAMPLES}`);
  return fromInterleaved(fftInterleaved(toInterleaved(s, size)));
}

/** Inverse DFT (scaled by 1/N); the input length must be a power of two. */
export function ifft(s: ComplexSignal): ComplexSignal {
  return fromInterleaved(fftInterleaved(toInterleaved(s, s.re.length), true));
}
