/**
 * Authoring contracts: designs, revisions, coefficient tables and uploads (issue 4).
 * A revision's `content` is what the author controls; the server materializes its coefficient tables
 * from it (generators run on the server, uploads are referenced by id) and `toAnalysisSpec` turns
 * content + tables into the DSP core's AnalysisSpec.
 */
import { z } from "zod";
import { nameSchema } from "./names";
import {
  AcceptanceLimitsSchema,
  DATAPATH_DEFAULTS,
  DatapathSpecSchema,
  FirSourceSchema,
  FixedPointSpecSchema,
  SweepSpecSchema,
  WaveformSourceSchema,
  WindowSpecSchema,
} from "./analysis";

export const DESIGN_KINDS = ["waveform", "filter"] as const;
export const DesignKindSchema = z.enum(DESIGN_KINDS);
export type DesignKind = z.infer<typeof DesignKindSchema>;

/** Revision life of DESIGN.md; issue 4 uses draft and in_review, issue 6 adds the rest. */
export const REVISION_STATES = ["draft", "in_review", "approved", "changes_requested", "released"] as const;
export const RevisionStateSchema = z.enum(REVISION_STATES);
export type RevisionState = z.infer<typeof RevisionStateSchema>;

export const TABLE_ROLES = ["tx", "rx", "fir"] as const;
export const TableRoleSchema = z.enum(TABLE_ROLES);
export type TableRole = z.infer<typeof TableRoleSchema>;

const positiveHz = z.number().positive("must be > 0 Hz").finite();

/** An uploaded file used as the transmit waveform (samples come from the upload). */
export const UploadedWaveformSourceSchema = z.object({
  kind: z.literal("upload"),
  uploadId: z.number().int().positive(),
  sampleRateHz: positiveHz,
});
/** An uploaded file used as FIR taps, with the bands to judge it by (Hz; real taps judged on |f|). */
export const UploadedFirSourceSchema = z.object({
  kind: z.literal("upload"),
  uploadId: z.number().int().positive(),
  sampleRateHz: positiveHz,
  passbands: z
    .array(z.tuple([z.number().finite(), z.number().finite()]))
    .min(1, "give at least one passband"),
  stopbands: z
    .array(z.tuple([z.number().finite(), z.number().finite()]))
    .min(1, "give at least one stopband"),
});

/** Generator sources for a waveform's transmit table (everything except explicit samples, which come by upload). */
export const AuthoredWaveformSourceSchema = z.discriminatedUnion("kind", [
  WaveformSourceSchema.options[0],
  WaveformSourceSchema.options[1],
  WaveformSourceSchema.options[2],
  UploadedWaveformSourceSchema,
]);
export const AuthoredFirSourceSchema = z.discriminatedUnion("kind", [
  FirSourceSchema.options[0],
  UploadedFirSourceSchema,
]);

const analysisOptions = {
  interpolation: z.number().int().min(1).max(16).default(8),
  limits: AcceptanceLimitsSchema.default({}),
  sweep: SweepSpecSchema.optional(),
  inputBits: z.number().int().min(2).max(32).default(14),
  datapath: DatapathSpecSchema.default(DATAPATH_DEFAULTS),
};

/** What an author controls in a waveform revision. */
export const WaveformContentSchema = z.object({
  kind: z.literal("waveform"),
  tx: AuthoredWaveformSourceSchema,
  rx: z
    .object({ window: WindowSpecSchema.default({ kind: "rectangular" }) })
    .default({ window: { kind: "rectangular" } }),
  fixedPoint: z.object({ tx: FixedPointSpecSchema, rx: FixedPointSpecSchema }),
  dopplerHz: z.number().finite().optional(),
  ...analysisOptions,
});
/** What an author controls in a filter revision. */
export const FilterContentSchema = z.object({
  kind: z.literal("filter"),
  fir: AuthoredFirSourceSchema,
  fixedPoint: z.object({ fir: FixedPointSpecSchema }),
  responsePoints: z.number().int().min(8192).max(1_048_576).default(8192),
  ...analysisOptions,
});
export const RevisionContentSchema = z.discriminatedUnion("kind", [
  WaveformContentSchema,
  FilterContentSchema,
]);
export type RevisionContent = z.infer<typeof RevisionContentSchema>;
export type RevisionContentInput = z.input<typeof RevisionContentSchema>;

/** A design name: normalised (NFC, single spaces), no invisible characters; unique per project in any case. */
export const DesignNameSchema = nameSchema(120);

/** POST /api/projects/:projectId/designs */
export const CreateDesignSchema = z.object({
  name: DesignNameSchema,
  description: z.string().trim().max(4000, "at most 4000 characters").default(""),
  content: RevisionContentSchema,
});
export type CreateDesignInput = z.input<typeof CreateDesignSchema>;

/** PATCH /api/revisions/:id (drafts only). */
export const UpdateRevisionSchema = z.object({ content: RevisionContentSchema });

/** One stored upload (POST /api/projects/:projectId/uploads, multipart field `file`). */
export const UploadSchema = z.object({
  id: z.number().int(),
  fileName: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  format: z.enum(["text", "csv", "tsv", "complex-text", "json"]),
  complex: z.boolean(),
  count: z.number().int(),
  createdAt: z.string(),
});
export type Upload = z.infer<typeof UploadSchema>;

const PersonSchema = z.object({ id: z.number().int(), displayName: z.string() });

export const RevisionSummarySchema = z.object({
  id: z.number().int(),
  number: z.number().int(),
  state: RevisionStateSchema,
  contentHash: z.string().nullable(),
  createdAt: z.string(),
  createdBy: PersonSchema,
  submittedAt: z.string().nullable(),
});
export type RevisionSummary = z.infer<typeof RevisionSummarySchema>;

export const DesignSummarySchema = z.object({
  id: z.number().int(),
  projectId: z.number().int(),
  name: z.string(),
  kind: DesignKindSchema,
  description: z.string(),
  owner: PersonSchema,
  latestRevision: RevisionSummarySchema.nullable(),
  /** Filled by issue 6 (releases); null until then. */
  latestRelease: z.object({ id: z.number().int(), version: z.string(), withdrawn: z.boolean() }).nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type DesignSummary = z.infer<typeof DesignSummarySchema>;

export const CoefficientTableSchema = z.object({
  id: z.number().int(),
  role: TableRoleSchema,
  complex: z.boolean(),
  length: z.number().int(),
  sampleRateHz: z.number(),
  /** Where the values came from: generator parameters, an upload (file name + SHA-256), or the matched filter of `tx`. */
  source: z.record(z.string(), z.unknown()),
  valuesSha256: z.string(),
});
export type CoefficientTable = z.infer<typeof CoefficientTableSchema>;

/** GET /api/projects/:projectId/designs */
export const DesignListSchema = z.object({ designs: z.array(DesignSummarySchema) });
/** GET /api/designs/:id */
export const DesignDetailSchema = z.object({
  design: DesignSummarySchema,
  project: z.object({ id: z.number().int(), slug: z.string(), name: z.string() }),
  revisions: z.array(RevisionSummarySchema),
  canEdit: z.boolean(),
});
/** GET /api/revisions/:id */
export const RevisionDetailSchema = z.object({
  revision: RevisionSummarySchema,
  design: DesignSummarySchema,
  project: z.object({ id: z.number().int(), slug: z.string(), name: z.string() }),
  content: RevisionContentSchema,
  tables: z.array(CoefficientTableSchema),
  uploads: z.array(UploadSchema),
  canEdit: z.boolean(),
});
export type RevisionDetail = z.infer<typeof RevisionDetailSchema>;
/** POST /api/projects/:projectId/designs → 201 */
export const CreatedDesignSchema = z.object({ design: DesignSummarySchema, revision: RevisionSummarySchema });
