/** Query keys for analyses: a revision's status and its stored report are invalidated separately. */
export const analysisKeys = {
  all: ["analysis"] as const,
  status: (revisionId: number) => [...analysisKeys.all, "status", revisionId] as const,
  report: (revisionId: number) => [...analysisKeys.all, "report", revisionId] as const,
};
