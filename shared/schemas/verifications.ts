/**
 * Verification runs: a firmware engineer's simulation output for one of a release's vector sets, compared
 * bit-exactly with the set's expected output read from the stored bundle (docs/verification.md).
 */
import { z } from "zod";
import { PersonSchema, ReleaseFileSchema } from "./releases";

/** The vector sets a bundle can carry (format 1.x bundles carry `scenario` only). */
export const VECTOR_SET_NAMES = [
  "scenario",
  "impulse",
  "worst-case",
  "rounding",
  "random-full-scale",
] as const;

/** A vector-set name as a form or a script sends it. */
export const VectorSetNameSchema = z
  .string()
  .trim()
  .regex(/^[a-z][a-z0-9-]{0,39}$/, "a vector-set name such as scenario or worst-case");

/** How the uploaded file is read: decimal `I Q` lines, `$readmemh`-style hex words, or by its name. */
export const UPLOAD_FORMATS = ["auto", "text", "hex"] as const;
export const UploadFormatSchema = z.enum(UPLOAD_FORMATS);
export type UploadFormat = z.infer<typeof UploadFormatSchema>;

/** The latest latency the comparison searches for when none is declared (leading samples skipped). */
export const MAX_LATENCY_SEARCH = 256;
/** The largest declared latency accepted, in samples. */
export const MAX_DECLARED_LATENCY = 1_000_000;
/** The largest simulation output accepted (bytes); a 65,536-sample set of 32-bit words is about 1.5 MB. */
export const MAX_VERIFICATION_UPLOAD_BYTES = 64 * 1024 * 1024;

const optionalText = (max: number, what: string) =>
  z.preprocess(
    (v) => (typeof v === "string" && v.trim() === "" ? undefined : v),
    z.string().trim().max(max, `${what}: at most ${max} characters`).optional(),
  );

/** The multipart fields of POST /api/releases/:id/verifications besides `file`. */
export const CreateVerificationFieldsSchema = z.object({
  vectorSet: VectorSetNameSchema,
  latency: z.preprocess(
    (v) => (v === "" || v === undefined || v === null ? undefined : v),
    z.coerce
      .number({ error: "a whole number of samples" })
      .int("a whole number of samples")
      .min(0, "at least 0 samples")
      .max(MAX_DECLARED_LATENCY, `at most ${MAX_DECLARED_LATENCY} samples`)
      .optional(),
  ),
  format: z.preprocess((v) => (v === "" ? undefined : v), UploadFormatSchema.default("auto")),
  simulator: optionalText(120, "simulator"),
  rtlRevision: optionalText(120, "RTL revision"),
});
export type CreateVerificationFields = z.infer<typeof CreateVerificationFieldsSchema>;

/** A complex integer sample. */
export const SampleSchema = z.object({ re: z.number().int(), im: z.number().int() });

/** The first expected sample that the upload does not reproduce (index into the expected output, from 0). */
export const FirstMismatchSchema = z.object({
  index: z.number().int(),
  expected: SampleSchema,
  /** Null when the upload ended before this sample. */
  got: SampleSchema.nullable(),
});
export type FirstMismatch = z.infer<typeof FirstMismatchSchema>;

/** |error| in output LSBs per bucket of consecutive expected samples (largest of I and Q), for the plot. */
export const ErrorEnvelopeSchema = z.object({
  /** Expected samples per point. */
  bucket: z.number().int().positive(),
  maxAbsLsb: z.array(z.number()),
});

/** One verification run as every route answers it. */
export const VerificationSchema = z.object({
  id: z.number().int(),
  releaseId: z.number().int(),
  vectorSet: z.string(),
  verdict: z.enum(["pass", "fail"]),
  /** Expected samples compared (the whole expected output). */
  compared: z.number().int(),
  /** Expected samples not reproduced exactly (missing ones included). */
  mismatches: z.number().int(),
  firstMismatch: FirstMismatchSchema.nullable(),
  /** Leading uploaded samples skipped before the comparison. */
  latencySamples: z.number().int(),
  latencySource: z.enum(["declared", "searched"]),
  /** The largest |got − expected| over the compared samples, in output LSBs (I or Q). */
  maxAbsErrorLsb: z.number(),
  /** Samples the upload lacks at the end, and samples after the expected output (ignored). */
  missingSamples: z.number().int(),
  extraSamples: z.number().int(),
  uploadedSamples: z.number().int(),
  outputBits: z.number().int(),
  format: z.enum(["text", "hex"]),
  fileName: z.string(),
  uploadSize: z.number().int(),
  uploadSha256: z.string(),
  simulator: z.string().nullable(),
  rtlRevision: z.string().nullable(),
  /** The release was withdrawn when the run was recorded. */
  releaseWithdrawn: z.boolean(),
  errorEnvelope: ErrorEnvelopeSchema,
  by: PersonSchema,
  at: z.string(),
});
export type Verification = z.infer<typeof VerificationSchema>;

/** POST /api/releases/:id/verifications answers 201 with it. */
export const VerificationResponseSchema = z.object({ verification: VerificationSchema });

/** GET /api/releases/:id/verifications: newest first. */
export const VerificationListSchema = z.object({ verifications: z.array(VerificationSchema) });

/** One vector set of a release, as its manifest describes it. */
export const VectorSetSchema = z.object({
  name: z.string(),
  description: z.string(),
  stimulus: z.object({ text: z.string(), hex: z.string(), length: z.number().int(), bits: z.number().int() }),
  expected: z.object({ text: z.string(), hex: z.string(), length: z.number().int(), bits: z.number().int() }),
  maxAbsAccumulator: z.string().nullable(),
  accumulatorBound: z.string().nullable(),
});
export type VectorSet = z.infer<typeof VectorSetSchema>;

/** A coefficient table's datapath as the manifest states it (fields absent from older bundles are null). */
export const TableSummarySchema = z.object({
  role: z.string(),
  complex: z.boolean(),
  length: z.number().int(),
  wordLength: z.number().int(),
  fractionLength: z.number().int(),
  signed: z.boolean(),
  gain: z.number(),
  rounding: z.string(),
  overflow: z.string(),
  overflowCount: z.number().int(),
  /** The datapath spec (input, accumulator, output widths, shift, rounding, overflow) when the bundle has one. */
  datapath: z.record(z.string(), z.union([z.string(), z.number(), z.boolean(), z.null()])).nullable(),
});
export type TableSummary = z.infer<typeof TableSummarySchema>;

/** GET /api/releases/:id/summary: what the manifest says, for the release and review pages. */
export const ReleaseSummarySchema = z.object({
  schemaVersion: z.string(),
  tables: z.array(TableSummarySchema),
  vectorSets: z.array(VectorSetSchema),
  approvals: z.array(z.object({ reviewer: z.string(), at: z.string(), comment: z.string() })),
  /** Every file of the zip, manifest.json and SHA256SUMS included, sorted by path (from the stored zip). */
  files: z.array(ReleaseFileSchema),
});
export type ReleaseSummary = z.infer<typeof ReleaseSummarySchema>;
