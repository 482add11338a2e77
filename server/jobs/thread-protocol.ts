import type { AnalysisReport } from "../../shared/dsp/analysis";

/** Main thread → analysis thread. */
export interface ThreadRequest {
  id: number;
  spec: unknown;
}

/** Analysis thread → main thread. */
export type ThreadReply =
  | { id: number; type: "progress"; fraction: number; stage: string }
  | { id: number; type: "done"; report: AnalysisReport }
  | { id: number; type: "error"; message: string };

interface IssueLike {
  path?: PropertyKey[];
  message?: string;
}

/**
 * Turn an analysis failure into words: a spec the DSP refuses (zod issues with their paths, or a
 * RangeError/TypeError from an input check) names the field; anything else keeps its message.
 */
export function describeAnalysisError(e: unknown): string {
  if (e && typeof e === "object" && "issues" in e && Array.isArray((e as { issues: unknown }).issues)) {
    const issues = (e as { issues: IssueLike[] }).issues;
    const lines = issues.map((i) => {
      const path = (i.path ?? []).map(String).join(".");
      return path ? `${path}: ${i.message ?? "invalid"}` : (i.message ?? "invalid");
    });
    return `The analysis spec is not valid: ${lines.join("; ")}`;
  }
  if (e instanceof RangeError || e instanceof TypeError)
    return `The analysis refused its input: ${e.message}`;
  if (e instanceof Error) return e.message;
  return String(e);
}
