/**
 * Phase-coded pulses: Barker (binary) and the polyphase Frank, P1, P2, P3, P4 codes, each chip held for
 * `samplesPerChip` samples at unit modulus.
 *
 * Barker sequences: M. A. Richards, "Fundamentals of Radar Signal Processing", 2nd ed., 2014, Table 4.1.
 * Frank: R. L. Frank, "Polyphase codes with good nonperiodic correlation properties", IEEE Trans. IT-9, 1963.
 * P1, P2: B. L. Lewis, F. F. Kretschmer, "A new class of polyphase pulse compression codes and techniques",
 * IEEE Trans. AES-17(3), 1981. P3, P4: Lewis & Kretschmer, "Linear frequency modulation derived polyphase pulse
 * compression codes", IEEE Trans. AES-18(5), 1982. Phase formulas as tabulated in N. Levanon, E. Mozeson,
 * "Radar Signals", Wiley, 2004, §6.2 (from memory; the tests check their defining properties).
 */
import { checkInteger, MAX_SAMPLES } from "./check";
import type { ComplexSignal } from "./types";

/** A phase code and its size. Frank/P1/P2 have N = order² chips; P3/P4 have `length` chips. */
export type PhaseCodeSpec =
  | { kind: "barker"; length: 2 | 3 | 4 | 5 | 7 | 11 | 13 }
  | { kind: "frank" | "p1" | "p2"; order: number }
  | { kind: "p3" | "p4"; length: number };

/** Barker sequences as ±1 chips (Richards 2014, Table 4.1). */
export const BARKER_CODES: Readonly<Record<2 | 3 | 4 | 5 | 7 | 11 | 13, readonly number[]>> = {
  2: [1, -1],
  3: [1, 1, -1],
  4: [1, 1, -1, 1],
  5: [1, 1, 1, -1, 1],
  7: [1, 1, 1, -1, -1, 1, -1],
  11: [1, 1, 1, -1, -1, -1, 1, -1, -1, 1, -1],
  13: [1, 1, 1, 1, 1, -1, -1, 1, 1, -1, 1, -1, 1],
};

/** Largest number of chips a polyphase code may have (samples are capped separately by MAX_SAMPLES). */
export const MAX_CHIPS = 65_536;

/** Chip phases in radians (one per chip) for a code. */
export function phaseCodePhases(code: PhaseCodeSpec): Float64Array {
  if (!code || typeof code !== "object") throw new TypeError("code must be a phase-code spec object");
  switch (code.kind) {
    case "barker": {
      const chips = BARKER_CODES[code.length as keyof typeof BARKER_CODES];
      if (!chips)
        throw new RangeError(
          `code.length must be a Barker length (2, 3, 4, 5, 7, 11, 13), got ${String(code.length)}`,
        );
      return Float64Array.from(chips, (c) => (c > 0 ? 0 : Math.PI));
    }
    case "frank":
    case "p1":
    case "p2": {
      checkInteger("code.order", code.order, 2, Math.floor(Math.sqrt(MAX_CHIPS)));
      const m = code.order;
      if (code.kind === "p2" && m % 2 !== 0) throw new RangeError(`code.order must be even for P2, got ${m}`);
      const out = new Float64Array(m * m);
      // Group n (outer, 1..M) holds M chips k (inner, 1..M); the sequence runs group by group.
      for (let n = 1; n <= m; n++) {
        for (let k = 1; k <= m; k++) {
          let phi: number;
          if (code.kind === "frank") phi = ((2 * Math.PI) / m) * (n - 1) * (k - 1);
          else if (code.kind === "p1") phi = (-Math.PI / m) * (m - (2 * n - 1)) * ((n - 1) * m + (k - 1));
          else phi = (Math.PI / (2 * m)) * (m + 1 - 2 * n) * (m + 1 - 2 * k);
          out[(n - 1) * m + (k - 1)] = phi;
        }
      }
      return out;
    }
    case "p3":
    case "p4": {
      checkInteger("code.length", code.length, 2, MAX_CHIPS);
      const n = code.length;
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        // P3 samples the phase of an LFM starting at 0 Hz; P4 the same sweep centred on 0 Hz.
        out[i] = code.kind === "p3" ? (Math.PI * i * i) / n : (Math.PI * i * i) / n - Math.PI * i;
      }
      return out;
    }
    default:
      throw new TypeError(`code.kind is unknown: ${String((code as { kind?: unknown }).kind)}`);
  }
}

/** The code as a unit-modulus complex pulse, each chip repeated `samplesPerChip` times (default 1). */
export function phaseCode(code: PhaseCodeSpec, opts?: { samplesPerChip?: number }): ComplexSignal {
  const spc = opts?.samplesPerChip ?? 1;
  checkInteger("samplesPerChip", spc, 1, MAX_SAMPLES);
  const phases = phaseCodePhases(code);
  const n = phases.length * spc;
  if (n > MAX_SAMPLES) throw new RangeError(`code has ${n} samples; at most ${MAX_SAMPLES} are allowed`);
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let c = 0; c < phases.length; c++) {
    const phi = phases[c]!;
    // Binary chips give exact ±1 (cos π is not exactly −1 in float64's sin).
    const cr = phi === 0 ? 1 : phi === Math.PI ? -1 : Math.cos(phi);
    const ci = phi === 0 || phi === Math.PI ? 0 : Math.sin(phi);
    for (let s = 0; s < spc; s++) {
      re[c * spc + s] = cr;
      im[c * spc + s] = ci;
    }
  }
  return { re, im };
}
