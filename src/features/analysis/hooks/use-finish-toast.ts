import { QueryObserver, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import type { AnalysisStatus } from "@shared/schemas/analyses";
import { verdictOf } from "@shared/report-words";
import { useToast } from "@/components/ui/toast";
import { analysisQueryOptions } from "../api/get-analysis";

// Revisions with a watcher alive, so two mounts (or a remount) never toast twice.
const watching = new Set<number>();

function finishMessage(a: AnalysisStatus): [string, "pass" | "fail" | "warn"] {
  if (a.state === "failed") return [`Analysis failed: ${a.error ?? "no reason given"}`, "fail"];
  const report = a.report as { limits?: Array<{ pass: boolean }> } | null;
  if (!report?.limits) return ["Analysis finished: report ready", "pass"];
  const verdict = verdictOf({ limits: report.limits });
  if (verdict === "not-judged")
    return ["Analysis finished: not judged, no acceptance limits are set", "warn"];
  return [`Analysis finished: ${verdict === "pass" ? "every limit passes" : "some limits fail"}`, verdict];
}

/**
 * Toasts once when a queued or running analysis ends. The watcher is a QueryObserver outside React, so it keeps
 * polling and still toasts after the user has left the revision page (the toast region lives in the app root).
 */
export function useFinishToast(revisionId: number, analysis: AnalysisStatus | null | undefined): void {
  const qc = useQueryClient();
  const toast = useToast();
  const active = analysis?.state === "queued" || analysis?.state === "running";
  useEffect(() => {
    if (!active || watching.has(revisionId)) return;
    watching.add(revisionId);
    const observer = new QueryObserver(qc, analysisQueryOptions(revisionId));
    const stop = observer.subscribe((result) => {
      const a = result.data;
      if (a === undefined || a?.state === "queued" || a?.state === "running") return;
      stop();
      watching.delete(revisionId);
      // null: the content changed under it (a new hash); nothing finished that this page asked about.
      if (a) toast(...finishMessage(a));
      // The review section shows the report summary of this content: refresh it (key root of features/reviews).
      void qc.invalidateQueries({ queryKey: ["reviews"] });
    });
  }, [active, qc, revisionId, toast]);
}
