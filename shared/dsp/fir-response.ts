/**
 * FIR frequency response and its figures: passband ripple (dB peak-to-peak), stopband attenuation (dB
 * below the passband) and DC gain. Response by a zero-padded FFT on ≥ 8192 points (Oppenheim & Schafer,
 * "Discrete-Time Signal Processing", ch. 7: the DTFT sampled by the DFT).
 */
import { checkInteger, checkRange, checkSignal } from "./check";
import { fftInterleaved, nextPow2, toInterleaved } from "./fft";
import type { ComplexSignal } from "./types";

/** Fewest response points used (DESIGN.md). */
export const MIN_RESPONSE_POINTS = 8192;

/** |H| on `points` bins of [0, fs) (at least 8192, a power of two ≥ the tap count); bin k is k·fs/points. */
export function firMagnitude(taps: ComplexSignal, points = MIN_RESPONSE_POINTS): Float64Array {
  checkSignal("taps", taps);
  checkInteger("points", points, MIN_RESPONSE_POINTS, 2 ** 24);
  const size = nextPow2(Math.max(points, taps.re.length));
  const spec = fftInterleaved(toInterleaved(taps, size));
  const mag = new Float64Array(size);
  for (let k = 0; k < size; k++) mag[k] = Math.hypot(spec[2 * k]!, spec[2 * k + 1]!);
  return mag;
}

/** Band edges in Hz, [low, high]. */
export type Band = readonly [number, number];

/** What the filter is judged by. */
export interface FirBands {
  sampleRateHz: number;
  passbands: readonly Band[];
  stopbands: readonly Band[];
}

/** Figures of one FIR response. */
export interface FirMetrics {
  passbandRippleDb: number;
  /** Mean passband gain (linear |H| averaged) in dB, the reference of the attenuation. */
  passbandGainDb: number;
  stopbandAttenuationDb: number;
  /** Σh (complex taps: its magnitude), and in dB. */
  dcGain: number;
  dcGainDb: number;
}

function inBands(f: number, bands: readonly Band[], mirror: boolean): boolean {
  for (const [lo, hi] of bands) {
    if (f >= lo && f <= hi) return true;
    if (mirror && -f >= lo && -f <= hi) return true;
  }
  return false;
}

/**
 * Ripple, attenuation and DC gain. Bin frequencies are signed (−fs/2..fs/2); real taps have a symmetric
 * response, so their bands are matched on |f|.
 */
export function firMetrics(taps: ComplexSignal, bands: FirBands, points = MIN_RESPONSE_POINTS): FirMetrics {
  checkRange("sampleRateHz", bands.sampleRateHz, 0, Number.MAX_VALUE, { exclusiveMin: true });
  const mag = firMagnitude(taps, points);
  const size = mag.length;
  const real = taps.im.every((v) => v === 0);
  let pMin = Infinity;
  let pMax = 0;
  let pSum = 0;
  let pCount = 0;
  let sMax = 0;
  let sCount = 0;
  for (let k = 0; k < size; k++) {
    const f = ((k < size / 2 ? k : k - size) * bands.sampleRateHz) / size;
    const m = mag[k]!;
    if (inBands(f, bands.passbands, real)) {
      if (m < pMin) pMin = m;
      if (m > pMax) pMax = m;
      pSum += m;
      pCount++;
    } else if (inBands(f, bands.stopbands, real)) {
      if (m > sMax) sMax = m;
      sCount++;
    }
  }
  if (pCount === 0) throw new RangeError("passbands contain no response point");
  if (sCount === 0) throw new RangeError("stopbands contain no response point");
  let dr = 0;
  let di = 0;
  for (let i = 0; i < taps.re.length; i++) {
    dr += taps.re[i]!;
    di += taps.im[i]!;
  }
  const passGain = pSum / pCount;
  const dc = Math.hypot(dr, di);
  return {
    passbandRippleDb: 20 * Math.log10(pMax / pMin),
    passbandGainDb: 20 * Math.log10(passGain),
    stopbandAttenuationDb: 20 * Math.log10(passGain / sMax),
    dcGain: dc,
    dcGainDb: 20 * Math.log10(dc),
  };
}
