/**
 * The stimuli of a bundle's vector sets besides `scenario` (server/bundles/golden.ts): `impulse`,
 * `worst-case`, `rounding` and `random-full-scale`, each with the sentence that says what it proves.
 * Pure: the same codes, datapath and seed always give the same samples.
 */
import type { IntegerSignal } from "../../shared/dsp/bit-true";
import { accumulatorExtremes, worstCaseStimulus, type ResolvedDatapath } from "../../shared/dsp/datapath";
import { createRng } from "../../shared/dsp/random";

/** A stimulus and what it is for. */
export interface SetStimulus {
  re: number[];
  im: number[];
  description: string;
}

/** Output index (full convolution) at which each rounding target sits, for the tests and the description. */
export interface RoundingTarget {
  component: "I" | "Q";
  output: number;
  accumulator: bigint;
}

const gcd = (a: bigint, b: bigint): bigint => {
  a = a < 0n ? -a : a;
  b = b < 0n ? -b : b;
  while (b) [a, b] = [b, a % b];
  return a;
};

/** Extended Euclid: [g, u, v] with a·u + b·v = g = gcd(a, b) ≥ 0. */
function extendedGcd(a: bigint, b: bigint): [bigint, bigint, bigint] {
  let [r0, r1, s0, s1, t0, t1] = [a, b, 1n, 0n, 0n, 1n];
  while (r1 !== 0n) {
    const q = r0 / r1;
    [r0, r1] = [r1, r0 - q * r1];
    [s0, s1] = [s1, s0 - q * s1];
    [t0, t1] = [t1, t0 - q * t1];
  }
  return r0 < 0n ? [-r0, -s0, -t0] : [r0, s0, t0];
}

/** Division rounded to nearest (ties away), BigInt. */
const divRound = (a: bigint, b: bigint): bigint => {
  const neg = a < 0n !== b < 0n;
  const aa = a < 0n ? -a : a;
  const bb = b < 0n ? -b : b;
  const q = (2n * aa + bb) / (2n * bb);
  return neg ? -q : q;
};

/**
 * Integers x[j] in [lo, hi] with Σ c[j]·x[j] = target, or null. Greedy on all but the two smallest
 * coprime-most coefficients (largest |c| first), then the last two solve the rest exactly by extended
 * Euclid, centred so both stay in range.
 */
export function solveExact(c: readonly number[], target: bigint, lo: number, hi: number): number[] | null {
  const idx = c.map((_, j) => j).filter((j) => c[j] !== 0);
  if (idx.length === 0) return target === 0n ? c.map(() => 0) : null;
  idx.sort((a, b) => Math.abs(c[b]!) - Math.abs(c[a]!) || a - b);
  // The finishing pair: among the 24 smallest, the pair of least gcd, then of least magnitude.
  const small = idx.slice(-24);
  let pair: [number, number] | null = null;
  let best = 0n;
  let bestSize = 0;
  for (let a = 0; a < small.length; a++)
    for (let b = a + 1; b < small.length; b++) {
      const g = gcd(BigInt(c[small[a]!]!), BigInt(c[small[b]!]!));
      const size = Math.max(Math.abs(c[small[a]!]!), Math.abs(c[small[b]!]!));
      if (pair === null || g < best || (g === best && size < bestSize)) {
        pair = [small[a]!, small[b]!];
        best = g;
        bestSize = size;
      }
    }
  const x = c.map(() => 0);
  let d = target;
  const bLo = BigInt(lo);
  const bHi = BigInt(hi);
  for (const j of idx) {
    if (pair && (j === pair[0] || j === pair[1])) continue;
    const cj = BigInt(c[j]!);
    let v = divRound(d, cj);
    if (v < bLo) v = bLo;
    if (v > bHi) v = bHi;
    x[j] = Number(v);
    d -= cj * v;
  }
  if (d === 0n) return x;
  if (!pair) {
    // One coefficient only: it divides the rest or nothing does.
    return null;
  }
  const a = BigInt(c[pair[0]]!);
  const b = BigInt(c[pair[1]]!);
  const [g, u0, v0] = extendedGcd(a, b);
  if (d % g !== 0n) return null;
  const k = d / g;
  const bg = b / g;
  const ag = a / g;
  // u = u0·k + bg·t, v = v0·k − ag·t; centre u, then try neighbours.
  const t0 = divRound(-u0 * k, bg);
  for (const dt of [0n, 1n, -1n, 2n, -2n, 3n, -3n]) {
    const t = t0 + dt;
    const u = u0 * k + bg * t;
    const v = v0 * k - ag * t;
    if (u >= bLo && u <= bHi && v >= bLo && v <= bHi) {
      x[pair[0]] = Number(u);
      x[pair[1]] = Number(v);
      return x;
    }
  }
  return null;
}

/** Full-scale impulses: P on I at input 0, then j·P at input Nh (complex tables only), P = 2^(B−1)−1. */
export function impulseSet(codes: IntegerSignal, dp: ResolvedDatapath): SetStimulus {
  const nh = codes.re.length;
  const complex = Array.from(codes.im).some((v) => v !== 0);
  const p = 2 ** (dp.inputBits - 1) - 1;
  const len = complex ? 2 * nh : 1;
  const re = new Array<number>(len).fill(0);
  const im = new Array<number>(len).fill(0);
  re[0] = p;
  if (complex) im[nh] = p;
  let symmetric = true;
  for (let k = 0; k < nh && symmetric; k++)
    if (codes.re[k] !== codes.re[nh - 1 - k] || codes.im[k] !== codes.im[nh - 1 - k]) symmetric = false;
  const sym = symmetric
    ? "This table is symmetric (h[k] = h[Nh−1−k] for every k), so reversed taps give the same output and no vector can tell them apart."
    : "This table is not symmetric (h[k] ≠ h[Nh−1−k] for some k), so an implementation with its taps reversed fails this set.";
  return {
    re,
    im,
    description:
      `Full-scale impulse ${p} on I at input 0${complex ? ` and j·${p} on Q at input ${nh}` : ""}: ` +
      `output k (k = 0…${nh - 1}) is ${p}·h[k] through the output stage, so the first output checks the latency ` +
      `(none: output n belongs to input n) and the order checks h[0] multiplies the newest sample. ${sym}`,
  };
}

/** The sign-matched full-scale blocks (shared/dsp/datapath.ts worstCaseStimulus). */
export function worstCaseSet(codes: IntegerSignal, dp: ResolvedDatapath): SetStimulus {
  const s = worstCaseStimulus(codes, dp.inputBits);
  const nh = codes.re.length;
  const ext = accumulatorExtremes(codes, dp.inputBits);
  return {
    ...s,
    description:
      `Sign-matched full-scale input (2^${dp.inputBits - 1}−1 where the coefficient is positive, −2^${dp.inputBits - 1} where negative), ` +
      `four blocks of ${nh} samples: outputs ${nh - 1}, ${2 * nh - 1}, ${3 * nh - 1}, ${4 * nh - 1} reach acc_I = ${ext.i.max}, ` +
      `acc_I = ${ext.i.min}, acc_Q = ${ext.q.max}, acc_Q = ${ext.q.min}, the largest values any input can give. ` +
      `|acc| ≤ ${ext.bound} needs ${dp.accumulatorRequiredBits} signed bits; the datapath has ${dp.accumulatorBits}` +
      (dp.accumulatorBits < dp.accumulatorRequiredBits
        ? ", so these extremes wrap in the accumulator (the expected output includes the wrap)."
        : ", so an accumulator one bit narrower than the required width fails this set."),
  };
}

/** Uniform random full-scale codes on I and Q, seeded. */
export function randomFullScaleSet(
  codes: IntegerSignal,
  dp: ResolvedDatapath,
  seed: number,
  length: number,
): SetStimulus {
  const rng = createRng(seed);
  const span = 2 ** dp.inputBits;
  const lo = -(2 ** (dp.inputBits - 1));
  const re: number[] = [];
  const im: number[] = [];
  for (let n = 0; n < length; n++) {
    re.push(lo + Math.floor(rng.uniform() * span));
    im.push(lo + Math.floor(rng.uniform() * span));
  }
  return {
    re,
    im,
    description:
      `${length} samples uniform over every ${dp.inputBits}-bit code on I and Q (xoshiro128** seeded with ${seed}, ` +
      `uniform() then I before Q): exercises every input bit and the accumulator well beyond the scenario's levels.`,
  };
}

/** The m of each tie target per component: q = (G'−1)/2 + G'·m then takes both signs and both parities. */
const TIE_QUOTIENTS = [0n, -1n, 1n, -2n];

/**
 * Inputs whose accumulator lands exactly halfway between two output codes (acc ≡ 2^(s−1) mod 2^s), on I and
 * on Q, with positive and negative values and odd and even quotients, then the four full-scale extremes
 * (saturation, where this output stage can saturate). One block of Nh samples per target.
 */
export function roundingSet(
  codes: IntegerSignal,
  dp: ResolvedDatapath,
): SetStimulus & { targets: RoundingTarget[] } {
  const nh = codes.re.length;
  const lo = -(2 ** (dp.inputBits - 1));
  const hi = 2 ** (dp.inputBits - 1) - 1;
  const s = dp.outputShift;
  const re: number[] = [];
  const im: number[] = [];
  const targets: RoundingTarget[] = [];
  let wanted = 0;
  if (s > 0) {
    const half = 1n << BigInt(s - 1);
    const step = 1n << BigInt(s);
    for (const component of ["I", "Q"] as const) {
      // Coefficients of the block's inputs (xI then xQ, input j meets tap Nh−1−j) for this component.
      const c: number[] = [];
      for (let j = 0; j < nh; j++) {
        const k = nh - 1 - j;
        c.push(component === "I" ? codes.re[k]! : codes.im[k]!);
      }
      for (let j = 0; j < nh; j++) {
        const k = nh - 1 - j;
        c.push(component === "I" ? -codes.im[k]! : codes.re[k]!);
      }
      // acc is a multiple of G = gcd(c); a tie (q + 1/2)·2^s needs 2^(s−1) to be one too (v2(G) < s)
      // and q ≡ −1/2 (mod G') for the odd part G' of G: q = (G' − 1)/2 + G'·m.
      let g = 0n;
      for (const v of c) g = gcd(g, BigInt(v));
      if (g === 0n) continue;
      let odd = g;
      let twos = 0;
      while (odd % 2n === 0n) {
        odd /= 2n;
        twos++;
      }
      if (twos >= s) {
        wanted += TIE_QUOTIENTS.length;
        continue;
      }
      const r = (odd - 1n) / 2n;
      for (const m0 of TIE_QUOTIENTS) {
        wanted++;
        for (let tries = 0; tries < 24; tries++) {
          // Same parity of m (hence of q), further out each try.
          const m = m0 + BigInt(8 * tries) * (m0 < 0n ? -1n : 1n);
          const target = (r + odd * m) * step + half;
          const x = solveExact(c, target, lo, hi);
          if (!x) continue;
          targets.push({ component, output: re.length + nh - 1, accumulator: target });
          for (let j = 0; j < nh; j++) {
            re.push(x[j]!);
            im.push(x[nh + j]!);
          }
          break;
        }
      }
    }
  }
  const ties = targets.length;
  const ws = worstCaseStimulus(codes, dp.inputBits);
  re.push(...ws.re);
  im.push(...ws.im);
  const ext = accumulatorExtremes(codes, dp.inputBits);
  const reach = ext.bound >> BigInt(s);
  const canSaturate = reach >= 1n << BigInt(dp.outputBits - 1);
  const tieText =
    s === 0
      ? "The output shift is 0, so the output stage never rounds: no ties exist."
      : `${ties} of ${wanted} exact ties reached (acc = (q + 1/2)·2^${s} on I and Q, q of both signs and parities` +
        (ties === 0
          ? "; none can be reached: every accumulator these coefficients give within the input range stays off the half-LSB grid"
          : "") +
        `), at outputs ${targets.map((t) => `${t.output} (${t.component})`).join(", ") || "—"}.`;
  return {
    re,
    im,
    targets,
    description:
      `Output-stage check for rounding ${dp.outputRounding} after a right shift of ${s}. ${tieText} ` +
      `Then the four sign-matched full-scale blocks: ` +
      (canSaturate
        ? `|acc|/2^${s} reaches ${reach}, beyond the ${dp.outputBits}-bit output, so they ${dp.outputOverflow === "saturate" ? "saturate" : "wrap"}.`
        : `|acc|/2^${s} stays within the ${dp.outputBits}-bit output, so this output stage cannot saturate.`),
  };
}
