import { QueryObserver, useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import type { AnalysisStatus } from "@shared/schemas/analyses";
import { useToast } from "@/components/ui/toast";
import { analysisQueryOptions } from "../api/get-analysis";

// Revisions with a watcher alive, so two mounts (or a remount) never toast twice.
const watching = new Set<number>();

function finishMessage(a: AnalysisStatus): [string, "pass" | "fail"] {
  if (a.state === "failed") return [`Analysis failed: ${a.error ?? "no reason given"}`, "fail"];
  const pass = a.report?.pass;
  return [
    `Analysis finished: ${pass === undefined ? "report ready" : pass ? "every limit passes" : "some limits fail"}`,
    pass === false ? "fail" : "pass",
  ];
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
