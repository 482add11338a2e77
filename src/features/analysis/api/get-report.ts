import { queryOptions, useQuery } from "@tanstack/react-query";
import type { AnalysisReport } from "@shared/dsp/analysis";
import { ReportDocumentSchema, type ReportHeader } from "@shared/schemas/analyses";
import { api } from "@/lib/api-client";
import { analysisKeys } from "./keys";

/** The stored report with its header; the zod schema checked the main fields, the rest is the DSP core's JSON. */
export interface ReportDocument {
  header: ReportHeader;
  report: AnalysisReport;
}

/** GET /api/revisions/:id/report.json (404 until the analysis of the current content is done). */
export const reportQueryOptions = (revisionId: number) =>
  queryOptions({
    queryKey: analysisKeys.report(revisionId),
    queryFn: async ({ signal }): Promise<ReportDocument> => {
      const doc = await api(`/revisions/${revisionId}/report.json`, { schema: ReportDocumentSchema, signal });
      return { header: doc.header, report: doc.report as unknown as AnalysisReport };
    },
  });

/** The report document of a revision. */
export function useReport(revisionId: number) {
  return useQuery(reportQueryOptions(revisionId));
}
