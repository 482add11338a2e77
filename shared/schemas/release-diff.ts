/**
 * Release diff contract (issue 7, firmware pages): what changed between two releases of one design —
 * fixed-point spec fields, the largest coefficient change in LSB per table, and the report's figures.
 */
import { z } from "zod";

/** GET /api/releases/:id/diff?against=:otherId */
export const ReleaseDiffQuerySchema = z.strictObject({
  against: z.coerce.number().int().positive("must be a release id"),
});

/** One side of the comparison. */
export const DiffSideSchema = z.object({
  id: z.number().int(),
  version: z.string(),
  revisionNumber: z.number().int(),
  contentHash: z.string(),
});

/** A fixed-point spec field (or the applied gain) whose value differs; null = the table is absent on that side. */
export const SpecChangeSchema = z.object({
  table: z.string(),
  field: z.string(),
  from: z.union([z.string(), z.number(), z.boolean()]).nullable(),
  to: z.union([z.string(), z.number(), z.boolean()]).nullable(),
});
export type SpecChange = z.infer<typeof SpecChangeSchema>;

/**
 * Coefficient change of one table, in LSB of the compared release (`to`): |v_to − v_from|·2^F_to with
 * v = code·2^−F, over the indices both tables have, I and Q separately. Null figures = table on one side only.
 */
export const TableChangeSchema = z.object({
  table: z.string(),
  lengthFrom: z.number().int().nullable(),
  lengthTo: z.number().int().nullable(),
  /** Words (I and Q counted separately) whose represented value differs. */
  changedWords: z.number().int().nullable(),
  maxChangeLsb: z.number().nullable(),
  /** Tap index of the largest change (first one on ties). */
  atIndex: z.number().int().nullable(),
});
export type TableChange = z.infer<typeof TableChangeSchema>;

/** One report figure on both sides; delta = to − from of the fixed-point figure. */
export const MetricChangeSchema = z.object({
  key: z.string(),
  from: z.object({ float: z.number().nullable(), fixed: z.number().nullable() }),
  to: z.object({ float: z.number().nullable(), fixed: z.number().nullable() }),
  deltaFixed: z.number().nullable(),
});
export type MetricChange = z.infer<typeof MetricChangeSchema>;

/** The whole diff. */
export const ReleaseDiffSchema = z.object({
  kind: z.enum(["waveform", "filter"]),
  from: DiffSideSchema,
  to: DiffSideSchema,
  sameContent: z.boolean(),
  spec: z.array(SpecChangeSchema),
  tables: z.array(TableChangeSchema),
  metrics: z.array(MetricChangeSchema),
});
export type ReleaseDiff = z.infer<typeof ReleaseDiffSchema>;
