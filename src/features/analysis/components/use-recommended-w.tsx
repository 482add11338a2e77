import { useQueryClient } from "@tanstack/react-query";
import type { AnalysisReport } from "@shared/dsp/analysis";
import type { RevisionContent, RevisionDetail } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { useToast } from "@/components/ui/toast";
import { useUpdateRevision } from "@/features/revisions/api/update-revision";
import { analysisKeys } from "../api/keys";

/**
 * The draft's content with the swept tables at word length `w`, integer bits W − F kept as the sweep varied
 * them (shared/dsp/analysis.ts sweepSpec), so only the resolution changes.
 */
export function withWordLength(
  content: RevisionContent,
  tables: readonly string[],
  w: number,
): RevisionContent {
  const fixedPoint = { ...content.fixedPoint } as Record<
    string,
    { wordLength: number; fractionLength: number }
  >;
  for (const role of tables) {
    const spec = fixedPoint[role];
    if (!spec) continue;
    fixedPoint[role] = {
      ...spec,
      wordLength: w,
      fractionLength: spec.fractionLength + (w - spec.wordLength),
    };
  }
  return { ...content, fixedPoint } as RevisionContent;
}

/**
 * "Use W = N": sets the swept table's word length on the draft to the sweep's smallest passing W. The content
 * changes, so the analysis is to be run again before the revision can be submitted.
 */
export function UseRecommendedW({
  report,
  detail,
  onApplied,
}: {
  report: Pick<AnalysisReport, "sweep" | "limits">;
  detail: RevisionDetail;
  onApplied?: () => void;
}) {
  const update = useUpdateRevision(detail.revision.id);
  const qc = useQueryClient();
  const toast = useToast();
  const sweep = report.sweep;
  const best = report.limits.length > 0 ? (sweep?.smallestPassingWordLength ?? null) : null;
  if (!sweep || best === null || detail.revision.state !== "draft" || !detail.canEdit) return null;
  const current = sweep.tables.map(
    (t) => (detail.content.fixedPoint as Record<string, { wordLength: number }>)[t]?.wordLength,
  );
  if (current.every((w) => w === best)) {
    return (
      <span className="text-xs text-ink-700">
        {sweep.tables.join(", ")} already at <span className="font-mono">W = {best}</span>
      </span>
    );
  }
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <Button
        size="sm"
        busy={update.isPending}
        onClick={() =>
          update.mutate(withWordLength(detail.content, sweep.tables, best), {
            onSuccess: () => {
              void qc.invalidateQueries({ queryKey: analysisKeys.all });
              toast(`${sweep.tables.join(", ")} set to W = ${best}: run the analysis again`, "neutral");
              onApplied?.();
            },
          })
        }
      >
        Use W = {best} for {sweep.tables.join(", ")}
      </Button>
      {update.isError && (
        <span role="alert" className="text-xs text-fail-700">
          {update.error.message}
        </span>
      )}
    </span>
  );
}
