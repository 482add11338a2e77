/** Query keys of a release's verification runs and manifest summary. */
export const verificationKeys = {
  all: ["verifications"] as const,
  list: (releaseId: number) => [...verificationKeys.all, "list", releaseId] as const,
  summary: (releaseId: number) => [...verificationKeys.all, "summary", releaseId] as const,
};
