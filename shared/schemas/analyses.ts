/**
 * Analysis status contracts (issue 5): what `POST/GET /api/revisions/:id/analysis` answer. The report itself
 * is the DSP core's AnalysisReport (shared/dsp/analysis.ts); its main fields are checked here, the rest passes.
 */
import { z } from "zod";

export const ANALYSIS_STATES = ["queued", "running", "done", "failed"] as const;
/** Where an analysis is in its life. */
export const AnalysisStateSchema = z.enum(ANALYSIS_STATES);
export type AnalysisState = z.infer<typeof AnalysisStateSchema>;

const figures = z.record(z.string(), z.number().nullable());

/** The main fields of an AnalysisReport; plots, sweep rows and definitions are kept as they come. */
export const AnalysisReportSchema = z
  .object({
    version: z.number().int(),
    kind: z.enum(["waveform", "filter"]),
    sampleRateHz: z.number(),
    interpolation: z.number().int(),
    tables: z.array(z.object({ role: z.enum(["tx", "rx", "fir"]) }).loose()),
    float: figures,
    fixed: figures,
    diff: figures,
    limits: z.array(
      z.object({ name: z.string(), limit: z.number(), value: z.number().nullable(), pass: z.boolean() }),
    ),
    pass: z.boolean(),
  })
  .loose();

/** GET/POST /api/revisions/:id/analysis: one analysis, keyed by the revision's content hash. */
export const AnalysisStatusSchema = z.object({
  contentHash: z.string(),
  state: AnalysisStateSchema,
  /** 0..1 while running. */
  progress: z.number().min(0).max(1),
  /** What the worker is doing (e.g. "quantize", "sweep"). */
  stage: z.string().nullable(),
  /** Why it failed, in words a user can act on. */
  error: z.string().nullable(),
  queuedAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  durationMs: z.number().int().nullable(),
  softwareVersion: z.string().nullable(),
  /** Only when done. */
  report: AnalysisReportSchema.nullable(),
});
export type AnalysisStatus = z.infer<typeof AnalysisStatusSchema>;

/** Body of POST (202) and GET /api/revisions/:id/analysis. */
export const AnalysisResponseSchema = z.object({ analysis: AnalysisStatusSchema.nullable() });

/** The header block of report.json and report.html. */
export const ReportHeaderSchema = z.object({
  project: z.string(),
  design: z.string(),
  revision: z.string(),
  contentHash: z.string(),
  generatedAt: z.string(),
  softwareVersion: z.string(),
});
export type ReportHeader = z.infer<typeof ReportHeaderSchema>;

/** GET /api/revisions/:id/report.json */
export const ReportDocumentSchema = z.object({ header: ReportHeaderSchema, report: AnalysisReportSchema });
