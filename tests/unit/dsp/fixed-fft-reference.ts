/**
 * Independent references for the fixed-point FFT tests (no test of its own): a BigInt
 * decimation-in-time recurrence with exact rational rounding, helpers and a naive float DFT.
 * The inverse reference uses conjugated twiddles directly (the model uses the I/Q swap form).
 */
import type { FixedFftSpec, StageSchedule } from "@shared/dsp/fast-convolution/fixed-fft";
import { createRng } from "@shared/dsp/random";
import type { RoundingMode } from "@shared/dsp/types";

// ---- Independent reference -------------------------------------------------------------------
// BigInt, no bit reversal, no in-place butterflies: level s holds the 2^s-point DFTs of the
// decimated sequences x[r + (N/2^s)·i] (r = 0..N/2^s−1), built from level s−1 by the textbook
// decimation-in-time recurrence S_s[r][k] = S_{s−1}[r][k] ± W^(k·N/2^s)·S_{s−1}[r + N/2^s][k].
// Rounding by exact rational comparison (BigInt division), twiddles from Math.cos/Math.sin directly.

export function refRound(num: bigint, den: bigint, mode: RoundingMode): bigint {
  // num/den, den > 0
  const t = num / den; // toward zero
  const rem = num - t * den;
  if (rem === 0n || mode === "toward-zero") return t;
  const down = num < 0n ? t - 1n : t;
  if (mode === "floor") return down;
  const twice = 2n * (num - down * den);
  if (twice > den) return down + 1n;
  if (twice < den) return down;
  if (mode === "nearest-away") return num > 0n ? down + 1n : down;
  return down % 2n === 0n ? down : down + 1n;
}

function refRoundFloat(v: number, mode: RoundingMode): number {
  const f = Math.floor(v);
  const d = v - f;
  if (mode === "floor") return f;
  if (mode === "toward-zero") return v < 0 ? Math.ceil(v) : f;
  if (d > 0.5) return f + 1;
  if (d < 0.5) return f;
  if (mode === "nearest-away") return v > 0 ? f + 1 : f;
  return f % 2 === 0 ? f : f + 1;
}

function refTwiddles(n: number, wt: number, mode: RoundingMode): { c: bigint[]; s: bigint[] } {
  const one = 2 ** (wt - 1);
  const c: bigint[] = [BigInt(one)];
  const s: bigint[] = [0n];
  for (let k = 1; k < n / 2; k++) {
    const cv = Math.min(refRoundFloat(one * Math.cos((2 * Math.PI * k) / n), mode), one - 1);
    const sv = Math.min(refRoundFloat(-one * Math.sin((2 * Math.PI * k) / n), mode), one - 1);
    c.push(BigInt(cv));
    s.push(BigInt(sv));
  }
  return { c, s };
}

export function refFft(
  xr: number[],
  xi: number[],
  spec: FixedFftSpec,
  inverse = false,
): { re: number[]; im: number[]; shifts: number[]; overflow: number } {
  const n = xr.length;
  const m = Math.log2(n);
  const { c, s } = refTwiddles(n, spec.twiddleBits, spec.twiddleRounding);
  const g = BigInt(spec.productGuardBits);
  const pDen = 2n ** BigInt(spec.twiddleBits - 1 - spec.productGuardBits);
  const max = 2n ** BigInt(spec.dataBits - 1) - 1n;
  const min = -(2n ** BigInt(spec.dataBits - 1));
  let level: { re: bigint[]; im: bigint[] }[] = [];
  for (let r = 0; r < n; r++) level.push({ re: [BigInt(xr[r]!)], im: [BigInt(xi[r]!)] });
  const shifts: number[] = [];
  let overflow = 0;
  for (let st = 1; st <= m; st++) {
    const R = n / 2 ** st;
    const half = 2 ** (st - 1);
    const next: { re: bigint[]; im: bigint[] }[] = [];
    let inMax = 0n;
    for (const sub of level)
      for (let k = 0; k < sub.re.length; k++) {
        const a = sub.re[k]! < 0n ? -sub.re[k]! : sub.re[k]!;
        const b = sub.im[k]! < 0n ? -sub.im[k]! : sub.im[k]!;
        if (a > inMax) inMax = a;
        if (b > inMax) inMax = b;
      }
    let tMax = 0n;
    for (let r = 0; r < R; r++) {
      const E = level[r]!;
      const O = level[r + R]!;
      const re: bigint[] = new Array<bigint>(2 * half);
      const im: bigint[] = new Array<bigint>(2 * half);
      for (let k = 0; k < half; k++) {
        const t = k * R;
        const ct = c[t]!;
        const sw = inverse ? -s[t]! : s[t]!; // inverse: conjugate twiddles e^(+j2πk/N)
        const abs = (v: bigint) => (v < 0n ? -v : v);
        if (abs(ct) + abs(sw) > tMax) tMax = abs(ct) + abs(sw);
        let pr: bigint;
        let pi: bigint;
        if (t === 0) {
          pr = O.re[k]! * 2n ** g;
          pi = O.im[k]! * 2n ** g;
        } else {
          pr = refRound(O.re[k]! * ct - O.im[k]! * sw, pDen, spec.rounding);
          pi = refRound(O.re[k]! * sw + O.im[k]! * ct, pDen, spec.rounding);
        }
        re[k] = E.re[k]! * 2n ** g + pr;
        im[k] = E.im[k]! * 2n ** g + pi;
        re[k + half] = E.re[k]! * 2n ** g - pr;
        im[k + half] = E.im[k]! * 2n ** g - pi;
      }
      next.push({ re, im });
    }
    const sch: StageSchedule = spec.schedule;
    let e = 0;
    const fits = (v: bigint, sh: number) => {
      const q = refRound(v, 2n ** (g + BigInt(sh)), spec.rounding);
      return q <= max && q >= min;
    };
    if (sch.kind === "every-stage") e = 1;
    else if (sch.kind === "stages") e = sch.shifts[st - 1]!;
    else if (sch.rule === "worst-case") {
      const pBound = st === 1 ? inMax * 2n ** g : (inMax * tMax + pDen - 1n) / pDen;
      const bound = inMax * 2n ** g + pBound;
      const den = (sh: number) => 2n ** (g + BigInt(sh));
      while (e < 2 && (bound + den(e) - 1n) / den(e) > max) e++;
    } else {
      const all = next.flatMap((q) => [...q.re, ...q.im]);
      while (e < 2 && !all.every((v) => fits(v, e))) e++;
    }
    shifts.push(e);
    const den = 2n ** (g + BigInt(e));
    for (const q of next)
      for (const part of [q.re, q.im])
        for (let k = 0; k < part.length; k++) {
          let v = refRound(part[k]!, den, spec.rounding);
          if (v > max || v < min) {
            overflow++;
            v = spec.overflow === "saturate" ? (v > max ? max : min) : BigInt.asIntN(spec.dataBits, v);
          }
          part[k] = v;
        }
    level = next;
  }
  return { re: level[0]!.re.map(Number), im: level[0]!.im.map(Number), shifts, overflow };
}

export function randomCodes(seed: number, n: number, bits: number, fill = 1): { re: number[]; im: number[] } {
  const rng = createRng(seed);
  const top = 2 ** (bits - 1);
  const draw = () => Math.min(top - 1, Math.floor((2 * rng.uniform() - 1) * top * fill));
  return { re: Array.from({ length: n }, draw), im: Array.from({ length: n }, draw) };
}

export function spec(over: Partial<FixedFftSpec>): FixedFftSpec {
  return {
    dataBits: 10,
    twiddleBits: 10,
    twiddleRounding: "nearest-even",
    rounding: "nearest-even",
    productGuardBits: 0,
    overflow: "saturate",
    schedule: { kind: "every-stage" },
    ...over,
  };
}

export function naiveDft(xr: number[], xi: number[], sign = -1): { re: number[]; im: number[] } {
  const n = xr.length;
  const re: number[] = [];
  const im: number[] = [];
  for (let k = 0; k < n; k++) {
    let a = 0;
    let b = 0;
    for (let t = 0; t < n; t++) {
      const th = (sign * 2 * Math.PI * ((k * t) % n)) / n;
      a += xr[t]! * Math.cos(th) - xi[t]! * Math.sin(th);
      b += xr[t]! * Math.sin(th) + xi[t]! * Math.cos(th);
    }
    re.push(a);
    im.push(b);
  }
  return { re, im };
}
