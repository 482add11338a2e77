/**
 * The bundle manifest, format "tapwright-bundle" 2.0 (docs/bundle-format.md field by field;
 * docs/schemas/manifest.schema.json is its JSON Schema and travels inside every bundle).
 */
import type { RoundingMode } from "../../shared/dsp/types";
import type { FixedPointSpec } from "../../shared/dsp/types";
import type { ResolvedDatapath } from "../../shared/dsp/datapath";
import type { GoldenSet } from "./golden";

/** Schema name written into every manifest. */
export const BUNDLE_SCHEMA = "tapwright-bundle";
/** Bumped on any change of the manifest or of the bundle layout (history in docs/bundle-format.md). */
export const BUNDLE_SCHEMA_VERSION = "2.0";

/** A person as a manifest names them. */
export interface ManifestPerson {
  username: string;
  displayName: string;
}

/** Where a table's float values came from. */
export interface ManifestProvenance {
  /** `generator`: computed from parameters; `upload`: a file kept byte for byte; `derived`: from another table. */
  method: "generator" | "upload" | "derived";
  /** Upload only: the original file name and the SHA-256 of its bytes. */
  fileName?: string;
  sha256?: string;
  /** The stored source record (generator parameters, upload reference, or derivation). */
  parameters: Record<string, unknown>;
}

/** One coefficient table of the release. */
export interface ManifestTable {
  role: string;
  position: number;
  complex: boolean;
  length: number;
  sampleRateHz: number;
  /** SHA-256 of the float64 values as stored (interleaved little-endian re, im). */
  valuesSha256: string;
  fixedPoint: FixedPointSpec;
  /** Gain applied to the float values before rounding (1 for as-given scaling). */
  gain: number;
  codeRange: { min: number; max: number };
  overflowCount: number;
  tapOrder: string;
  provenance: ManifestProvenance;
  /** The rendered files of this table, one per template. */
  exports: { template: string; path: string }[];
  /** The datapath the golden vectors prove (the receive or FIR table); null for the transmit table. */
  datapath: ManifestDatapath | null;
}

/** A table's datapath as the manifest states it (shared/dsp/datapath.ts ResolvedDatapath). */
export interface ManifestDatapath {
  inputBits: number;
  accumulatorBits: number;
  outputBits: number;
  outputShift: number;
  outputRounding: RoundingMode;
  outputOverflow: "saturate" | "wrap";
  /** True when the author set the width or the shift; false = derived. */
  accumulatorBitsSet: boolean;
  outputShiftSet: boolean;
  accumulatorRuleBits: number;
  accumulatorRequiredBits: number;
  /** Largest |accumulator| any input can reach (decimal text). */
  accumulatorBound: string;
}

/** One file of the bundle. */
export interface ManifestFile {
  path: string;
  size: number;
  sha256: string;
}

/** The whole manifest.json. */
export interface BundleManifest {
  schema: typeof BUNDLE_SCHEMA;
  schemaVersion: typeof BUNDLE_SCHEMA_VERSION;
  project: { slug: string; name: string };
  design: { id: number; name: string; kind: "waveform" | "filter" };
  version: string;
  notes: string;
  revision: { id: number; number: number };
  contentHash: string;
  released: { at: string; by: ManifestPerson };
  approvals: {
    reviewer: ManifestPerson;
    at: string;
    contentHash: string;
    reportHash: string;
    comment: string;
  }[];
  conventions: {
    tapOrder: string;
    codes: string;
    complex: string;
    checksums: string;
  };
  tables: ManifestTable[];
  templates: { id: string; name: string; version: number; kind: "text" | "binary" }[];
  golden: {
    /** golden/sets.json: the datapath, the scenario's parameters and every set. */
    summary: string;
    filterTable: string;
    /** Noise seed of the scenario (the random set uses seed + 1). */
    seed: number;
    sets: GoldenSet[];
  };
  /** The HDL of the bundle: testbenches and the reference FIR, Verilog-2005 and VHDL-2008. */
  hdl: {
    verilog: { readonly testbench: string; readonly reference: string };
    vhdl: { readonly testbench: string; readonly reference: string };
  };
  report: { html: string; json: string; generatedAt: string; softwareVersion: string };
  transmitCaution: string | null;
  /** Every file of the bundle except manifest.json and SHA256SUMS, sorted by path. */
  files: ManifestFile[];
}

/** The caution of DESIGN.md for transmit waveforms, written into README.txt and the manifest. */
export const TRANSMIT_CAUTION =
  "These coefficients can drive a real transmitter. A wrap-around overflow or a wrong scale can put full-scale " +
  "glitches into a power amplifier. Verify the waveform on a dummy load or in simulation first, and follow the " +
  "local spectrum and RF-exposure rules and your organisation's own sign-off practice before radiating.";

/** Provenance from a coefficient table's stored source record. */
export function provenanceOf(source: Record<string, unknown>): ManifestProvenance {
  if (source.kind === "upload")
    return {
      method: "upload",
      fileName: String(source.fileName ?? ""),
      sha256: String(source.sha256 ?? ""),
      parameters: source,
    };
  if (source.kind === "matched-filter") return { method: "derived", parameters: source };
  return { method: "generator", parameters: source };
}

/** The manifest's datapath entry of a resolved datapath. */
export function manifestDatapath(dp: ResolvedDatapath): ManifestDatapath {
  return {
    inputBits: dp.inputBits,
    accumulatorBits: dp.accumulatorBits,
    outputBits: dp.outputBits,
    outputShift: dp.outputShift,
    outputRounding: dp.outputRounding,
    outputOverflow: dp.outputOverflow,
    accumulatorBitsSet: dp.accumulatorBitsSet,
    outputShiftSet: dp.outputShiftSet,
    accumulatorRuleBits: dp.accumulatorRuleBits,
    accumulatorRequiredBits: dp.accumulatorRequiredBits,
    accumulatorBound: dp.accumulatorBound,
  };
}
