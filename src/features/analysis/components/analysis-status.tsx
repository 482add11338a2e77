import { Link } from "react-router-dom";
import type { AnalysisReport } from "@shared/dsp/analysis";
import type { AnalysisStatus } from "@shared/schemas/analyses";
import type { RevisionDetail } from "@shared/schemas/designs";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { VERDICT_TONE } from "@/lib/verdict";
import { VERDICT_WORDS, verdictOf } from "@shared/report-words";
import { formatDuration, formatElapsed } from "@/lib/format";
import { limitChips } from "../lib/metric-rows";
import { percent, secondsLeft, stageLabel } from "../lib/progress";
import { LimitChipStrip } from "./limit-chips";
import { UseRecommendedW } from "./use-recommended-w";

/** A labelled progress bar with the stage in words and the time left. */
export function AnalysisProgress({ analysis, nowMs }: { analysis: AnalysisStatus; nowMs: number }) {
  const pct = percent(analysis.progress);
  const left =
    analysis.state === "running" ? secondsLeft(analysis.progress, analysis.startedAt, nowMs) : null;
  const stage = analysis.state === "queued" ? "Queued: waiting for a worker" : stageLabel(analysis.stage);
  return (
    <div className="flex flex-col gap-1.5">
      <div className="flex items-baseline justify-between gap-4 text-sm">
        <span className="text-ink-800">{stage}</span>
        <span className="font-mono text-xs text-ink-700">
          {pct} %{left !== null && <> · about {formatDuration(Math.ceil(left))} left</>}
        </span>
      </div>
      <div
        role="progressbar"
        aria-label="Analysis progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        aria-valuetext={`${pct} %, ${stage}`}
        className="h-2 w-full overflow-hidden rounded-sm bg-paper-300"
      >
        <div className="h-full bg-signal-600 transition-[width] duration-500" style={{ width: `${pct}%` }} />
      </div>
      <p className="text-xs text-ink-600">You can leave this page: the analysis goes on on the server.</p>
    </div>
  );
}

/** A finished analysis: verdict, the chips, the recommended word length, and the way to the report. */
export function AnalysisDone({
  analysis,
  revisionId,
  detail,
}: {
  analysis: AnalysisStatus;
  revisionId: number;
  detail?: RevisionDetail;
}) {
  const report = analysis.report as unknown as AnalysisReport | null;
  if (!report) return null;
  const passed = report.limits.filter((c) => c.pass).length;
  const verdict = verdictOf(report);
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <Badge tone={VERDICT_TONE[verdict]}>{VERDICT_WORDS[verdict]}</Badge>
        <span className="text-sm text-ink-700">
          {verdict === "not-judged" ? (
            <>set acceptance limits to judge this revision</>
          ) : (
            <>
              <span className="font-mono">{passed}</span> of{" "}
              <span className="font-mono">{report.limits.length}</span> limits pass
            </>
          )}
          {report.sweep && verdict !== "not-judged" && (
            <>
              {" · smallest passing word length "}
              <span className="font-mono">
                {report.sweep.smallestPassingWordLength === null
                  ? "none in the sweep"
                  : `W = ${report.sweep.smallestPassingWordLength}`}
              </span>
            </>
          )}
          {analysis.durationMs !== null && (
            <>
              {" · computed in "}
              <span className="font-mono">{formatElapsed(analysis.durationMs)}</span>
            </>
          )}
        </span>
        <Link
          to={`/revisions/${revisionId}/report`}
          className="text-sm font-medium text-signal-800 underline hover:text-signal-900"
        >
          Open the report
        </Link>
      </div>
      {detail && <UseRecommendedW report={report} detail={detail} />}
      <LimitChipStrip groups={limitChips(report)} />
    </div>
  );
}

/** A failed analysis: the reason and a way to try again. */
export function AnalysisFailed({
  analysis,
  onRetry,
  busy,
  canRun,
}: {
  analysis: AnalysisStatus;
  onRetry: () => void;
  busy: boolean;
  canRun: boolean;
}) {
  return (
    <div
      role="alert"
      className="flex items-start justify-between gap-4 rounded border border-fail-100 bg-fail-50 px-4 py-3"
    >
      <div>
        <p className="text-sm font-medium text-fail-800">The analysis failed</p>
        <p className="text-sm text-fail-700">{analysis.error ?? "No reason was recorded."}</p>
      </div>
      {canRun && (
        <Button size="sm" onClick={onRetry} busy={busy}>
          Run again
        </Button>
      )}
    </div>
  );
}
