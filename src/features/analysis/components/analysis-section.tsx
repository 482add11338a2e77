import type { Role } from "@shared/schemas/auth";
import { Button } from "@/components/ui/button";
import { Section } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { useMe } from "@/features/auth/api/get-me";
import { useRevision } from "@/features/revisions/api/get-revision";
import { hasAnyRole } from "@/lib/roles";
import { useAnalysis } from "../api/get-analysis";
import { useRunAnalysis } from "../api/run-analysis";
import { useFinishToast } from "../hooks/use-finish-toast";
import { AnalysisDone, AnalysisFailed, AnalysisProgress } from "./analysis-status";
import { SweepRange } from "./sweep-range";
import { WhatIfPanel } from "./what-if-panel";

// The server allows authors and reviewers who are members to start an analysis.
const MAY_RUN: readonly Role[] = ["author", "reviewer"];

/** The revision page's "Analysis" section: live status, the run action, the verdict, and what-if on drafts. */
export function AnalysisSection({ revisionId }: { revisionId: number }) {
  const status = useAnalysis(revisionId);
  const revision = useRevision(revisionId);
  const me = useMe();
  const run = useRunAnalysis(revisionId);
  useFinishToast(revisionId, status.data);

  const canRun = hasAnyRole(me.data?.roles ?? [], MAY_RUN);
  const analysis = status.data ?? null;
  const active = analysis?.state === "queued" || analysis?.state === "running";
  const action =
    canRun && analysis?.state !== "failed" ? (
      <Button
        size="sm"
        onClick={() => run.mutate()}
        busy={run.isPending}
        disabled={status.isPending || active || analysis?.state === "done"}
      >
        Run analysis
      </Button>
    ) : undefined;

  let body;
  if (status.isPending) body = <TableSkeleton rows={2} label="Loading the analysis status" />;
  else if (status.isError) body = <ErrorState error={status.error} onRetry={() => void status.refetch()} />;
  else if (!analysis)
    body = (
      <EmptyState title="Not analysed yet">
        {canRun
          ? "Run the analysis to compare the fixed-point tables with the float reference and check the acceptance limits."
          : "An author or reviewer can run the analysis of this revision."}
      </EmptyState>
    );
  else if (active) body = <AnalysisProgress analysis={analysis} nowMs={Date.now()} />;
  else if (analysis.state === "failed")
    body = (
      <AnalysisFailed analysis={analysis} onRetry={() => run.mutate()} busy={run.isPending} canRun={canRun} />
    );
  else body = <AnalysisDone analysis={analysis} revisionId={revisionId} detail={revision.data} />;

  const detail = revision.data;
  const authorDraft =
    detail &&
    detail.revision.state === "draft" &&
    detail.canEdit &&
    hasAnyRole(me.data?.roles ?? [], ["author"]);
  return (
    <Section title="Analysis" action={action}>
      <div className="flex flex-col gap-4" data-testid="analysis-section">
        {run.isError && <ErrorState title="The analysis could not be started" error={run.error} />}
        {body}
        {authorDraft && (
          <SweepRange
            key={JSON.stringify([detail.content.sweep ?? null, detail.content.fixedPoint])}
            detail={detail}
          />
        )}
        {authorDraft && (
          <WhatIfPanel
            key={JSON.stringify(detail.content.fixedPoint)}
            revisionId={revisionId}
            detail={detail}
            saved={analysis?.state === "done" ? analysis.report : null}
          />
        )}
      </div>
    </Section>
  );
}
