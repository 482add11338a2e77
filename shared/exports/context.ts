/**
 * The render context of one coefficient table: what every export template sees (documented field by
 * field in docs/export-templates.md). Pure, so the browser preview builds exactly what the server renders.
 */
import { exactDecimal } from "../dsp/exact-decimal";
import { integerRange } from "../dsp/quantize";
import type { ComplexSignal, FixedPointSpec, QuantizedTable } from "../dsp/types";
import { cIdent } from "./identifiers";
import { cIntegerType, hexWord, storageBits } from "./words";

/** Bumped when a field is renamed or removed (adding a field keeps the version). */
export const EXPORT_CONTEXT_VERSION = 1;

/** The tap-order convention every bundle states (DESIGN.md). */
export const TAP_ORDER = "y[n] = Σ h[k]·x[n−k]";

// VHDL-2008 guarantees INTEGER only over −(2^31−1) .. 2^31−1 (IEEE 1076-2008 §5.2.3.2).
const VHDL_INTEGER_MAX = 2 ** 31 - 1;

/** What the caller knows about one quantized table. */
export interface ExportTableInput {
  project: { name: string; slug: string };
  design: { name: string; kind: "waveform" | "filter" };
  /** Release version ("2.1.0"), or null before a release. */
  version: string | null;
  revision: number;
  contentHash: string;
  role: string;
  sampleRateHz: number;
  complex: boolean;
  spec: FixedPointSpec;
  /** Gain applied before rounding (QuantizedTable.gain). */
  gain: number;
  /** Integer codes, I and Q (Q all zero for a real table). */
  codes: { re: ArrayLike<number>; im: ArrayLike<number> };
  /** Float reference on the codes' scale: gain × the design's coefficients. */
  reference: { re: ArrayLike<number>; im: ArrayLike<number> };
}

/** One tap as templates see it. */
export interface ExportTap {
  index: number;
  i: number;
  q: number;
  i_exact: string;
  q_exact: string;
  i_float: string;
  q_float: string;
  i_hex: string;
  q_hex: string;
}

/** The whole render context (snake_case, the usual Liquid style). */
export interface ExportContext {
  context_version: number;
  project: { name: string; slug: string };
  design: { name: string; kind: string };
  version: string | null;
  revision: number;
  content_hash: string;
  table: { role: string; length: number; complex: boolean; sample_rate_hz: number; ident: string };
  spec: {
    word_length: number;
    fraction_length: number;
    signed: boolean;
    scaling: string;
    rounding: string;
    overflow: string;
    gain: string;
    min_code: number;
    max_code: number;
    storage_bits: number;
    c_type: string;
    vhdl_integer_ok: boolean;
  };
  tap_order: string;
  taps: ExportTap[];
}

/** Shortest round-trip decimal of a float (ECMAScript Number::toString), with −0 written as 0. */
export function floatText(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`float reference must be finite, got ${x}`);
  return x === 0 ? "0" : String(x);
}

/** Builds the render context of one table; throws RangeError when a code does not fit the spec. */
export function buildExportContext(input: ExportTableInput): ExportContext {
  const { spec, codes, reference } = input;
  const n = codes.re.length;
  if (codes.im.length !== n || reference.re.length !== n || reference.im.length !== n)
    throw new RangeError("codes and reference must have the same length");
  const W = spec.wordLength;
  const F = spec.fractionLength;
  const { min, max } = integerRange(W, spec.signed);
  const taps: ExportTap[] = new Array<ExportTap>(n);
  for (let k = 0; k < n; k++) {
    const i = codes.re[k] as number;
    // A real table's Q is zero by definition; normalise −0 and ignore stray imaginary parts.
    const q = input.complex ? (codes.im[k] as number) : 0;
    for (const c of [i, q])
      if (!Number.isInteger(c) || c < min || c > max)
        throw new RangeError(`code ${c} at tap ${k} is outside ${min}..${max}`);
    taps[k] = {
      index: k,
      i: i + 0,
      q: q + 0,
      i_exact: exactDecimal(i, F),
      q_exact: exactDecimal(q, F),
      i_float: floatText(reference.re[k] as number),
      q_float: input.complex ? floatText(reference.im[k] as number) : "0",
      i_hex: hexWord(i, W, spec.signed),
      q_hex: hexWord(q, W, spec.signed),
    };
  }
  return {
    context_version: EXPORT_CONTEXT_VERSION,
    project: { name: input.project.name, slug: input.project.slug },
    design: { name: input.design.name, kind: input.design.kind },
    version: input.version,
    revision: input.revision,
    content_hash: input.contentHash,
    table: {
      role: input.role,
      length: n,
      complex: input.complex,
      sample_rate_hz: input.sampleRateHz,
      ident: cIdent(`${input.design.name} ${input.role}`),
    },
    spec: {
      word_length: W,
      fraction_length: F,
      signed: spec.signed,
      scaling: spec.scaling,
      rounding: spec.rounding,
      overflow: spec.overflow,
      gain: floatText(input.gain),
      min_code: min,
      max_code: max,
      storage_bits: storageBits(W),
      c_type: cIntegerType(W, spec.signed),
      vhdl_integer_ok: -min <= VHDL_INTEGER_MAX && max <= VHDL_INTEGER_MAX,
    },
    tap_order: TAP_ORDER,
    taps,
  };
}

/** The table fields of ExportTableInput from a quantizer result and the float coefficients it came from. */
export function quantizedTableFields(
  signal: ComplexSignal,
  q: QuantizedTable,
): Pick<ExportTableInput, "spec" | "gain" | "codes" | "reference"> {
  const n = signal.re.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    re[k] = q.gain * (signal.re[k] as number);
    im[k] = q.gain * (signal.im[k] as number);
  }
  return { spec: q.spec, gain: q.gain, codes: { re: q.re, im: q.im }, reference: { re, im } };
}
