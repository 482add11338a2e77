/**
 * The seeded test scenario behind golden vectors: point targets echoing the waveform plus complex
 * white Gaussian noise, quantized to signed `inputBits` integers (the ADC codes). The returned
 * `scenario` states everything needed to rebuild the same integers, so a bundle can print it.
 *
 * x[n] = Q( F · ( Σ_t a_t·e^{jφ_t}·s[n − d_t] + σ/√2 · (g_I[n] + j·g_Q[n]) ) )
 * with F = 2^(inputBits−1) − 1 (the largest code), s the waveform (zero outside 0..Ns−1), σ the complex
 * noise RMS relative to F, g drawn from createRng(seed).gaussian() for n = 0, 1, … with I before Q,
 * and Q = round half to even, then saturate.
 */
import { checkFiniteNumber, checkInteger, checkRange, checkSignal, MAX_SAMPLES } from "./check";
import { quantize } from "./quantize";
import { createRng } from "./random";
import type { ComplexSignal } from "./types";

/** One point target: integer delay in samples, amplitude relative to full scale, carrier phase. */
export interface StimulusTarget {
  delay: number;
  amplitude: number;
  phaseRad?: number;
}

/** What makeStimulus needs. */
export interface StimulusOptions {
  waveform: ComplexSignal;
  /** Number of output samples. */
  length: number;
  targets: StimulusTarget[];
  /** Complex noise RMS relative to full scale (each of I and Q has σ/√2). */
  noiseRms: number;
  /** Integer 0..2^53−1. */
  seed: number;
  /** Signed ADC width, 2..32. */
  inputBits: number;
}

/** A complete, serializable statement of how a stimulus was made. */
export interface StimulusScenario {
  schema: "tapwright.stimulus";
  schemaVersion: 1;
  description: string;
  length: number;
  waveformLength: number;
  inputBits: number;
  fullScaleCode: number;
  seed: number;
  random: { uniform: string; gaussian: string; drawOrder: string };
  targets: { delay: number; amplitude: number; phaseRad: number }[];
  noise: { rmsRelativeToFullScale: number; sigmaPerComponent: number };
  quantization: { rounding: "nearest-even"; overflow: "saturate"; clippedCount: number };
}

/** Builds the seeded stimulus: integer I/Q codes and the scenario that describes them. */
export function makeStimulus(opts: StimulusOptions): {
  re: Float64Array;
  im: Float64Array;
  clippedCount: number;
  scenario: StimulusScenario;
} {
  if (opts == null || typeof opts !== "object") throw new TypeError("options must be an object");
  const { waveform, length, targets, noiseRms, seed, inputBits } = opts;
  checkSignal("waveform", waveform);
  checkInteger("length", length, 1, MAX_SAMPLES);
  checkInteger("inputBits", inputBits, 2, 32);
  checkInteger("seed", seed, 0, Number.MAX_SAFE_INTEGER);
  checkRange("noiseRms", noiseRms, 0, 100);
  if (!Array.isArray(targets)) throw new TypeError("targets must be an array");
  const cleanTargets = targets.map((t, i) => {
    if (t == null || typeof t !== "object") throw new TypeError(`targets[${i}] must be an object`);
    checkInteger(`targets[${i}].delay`, t.delay, 0, length - 1);
    checkRange(`targets[${i}].amplitude`, t.amplitude, 0, 100);
    const phaseRad = t.phaseRad ?? 0;
    checkFiniteNumber(`targets[${i}].phaseRad`, phaseRad);
    return { delay: t.delay, amplitude: t.amplitude, phaseRad };
  });

  const fullScale = 2 ** (inputBits - 1) - 1;
  const re = new Float64Array(length);
  const im = new Float64Array(length);
  const ns = waveform.re.length;
  for (const t of cleanTargets) {
    const cr = t.amplitude * Math.cos(t.phaseRad);
    const ci = t.amplitude * Math.sin(t.phaseRad);
    const end = Math.min(length, t.delay + ns);
    for (let n = t.delay; n < end; n++) {
      const sr = waveform.re[n - t.delay]!;
      const si = waveform.im[n - t.delay]!;
      re[n]! += cr * sr - ci * si;
      im[n]! += cr * si + ci * sr;
    }
  }
  const sigma = noiseRms / Math.SQRT2;
  const rng = createRng(seed);
  for (let n = 0; n < length; n++) {
    // Draw even when σ = 0 so the noise sequence never depends on σ.
    const gi = rng.gaussian();
    const gq = rng.gaussian();
    re[n] = (re[n]! + sigma * gi) * fullScale;
    im[n] = (im[n]! + sigma * gq) * fullScale;
  }
  const q = quantize(
    { re, im },
    {
      wordLength: inputBits,
      fractionLength: 0,
      signed: true,
      scaling: "as-given",
      rounding: "nearest-even",
      overflow: "saturate",
    },
    { re, im, valueRe: new Float64Array(length), valueIm: new Float64Array(length) },
  );
  const scenario: StimulusScenario = {
    schema: "tapwright.stimulus",
    schemaVersion: 1,
    description:
      "x[n] = Q(F·(Σ a·e^{jφ}·s[n−d] + σ/√2·(gI[n] + j·gQ[n]))), F = 2^(inputBits−1)−1, s = the waveform (zero outside), Q = round half to even then saturate to inputBits signed",
    length,
    waveformLength: ns,
    inputBits,
    fullScaleCode: fullScale,
    seed,
    random: {
      uniform:
        "xoshiro128** 1.1 (Blackman & Vigna), state = two SplitMix64 outputs from the seed (low word first); uniform = ((a>>>5)·2^26 + (b>>>6))/2^53",
      gaussian: "Box–Muller, Marsaglia polar form, pairs used first-then-second; logarithm from + − × ÷ only",
      drawOrder: "for n = 0..length−1: gI[n] then gQ[n]",
    },
    targets: cleanTargets,
    noise: { rmsRelativeToFullScale: noiseRms, sigmaPerComponent: sigma },
    quantization: { rounding: "nearest-even", overflow: "saturate", clippedCount: q.overflowCount },
  };
  return { re: q.re, im: q.im, clippedCount: q.overflowCount, scenario };
}
