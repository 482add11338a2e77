import { useEffect, useRef } from "react";
import type { AnalysisStatus } from "@shared/schemas/analyses";
import { useToast } from "@/components/ui/toast";

/** Toasts once when an analysis this page watched while queued/running ends (done or failed). */
export function useFinishToast(analysis: AnalysisStatus | null | undefined): void {
  const toast = useToast();
  const previous = useRef<AnalysisStatus["state"] | null>(null);
  useEffect(() => {
    const now = analysis?.state ?? null;
    const was = previous.current;
    previous.current = now;
    if (was !== "queued" && was !== "running") return;
    if (now === "done") {
      const verdict = analysis?.report ? (analysis.report.pass ? "every limit passes" : "some limits fail") : "report ready";
      toast(`Analysis finished: ${verdict}`, analysis?.report?.pass === false ? "fail" : "pass");
    } else if (now === "failed") {
      toast(`Analysis failed: ${analysis?.error ?? "no reason given"}`, "fail");
    }
  }, [analysis, toast]);
}
