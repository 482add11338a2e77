import { Link } from "react-router-dom";
import { VERDICT_WORDS, verdictOf } from "@shared/report-words";
import { VERDICT_TONE } from "@/lib/verdict";
import type { ReviewDecision, ReviewPage } from "@shared/schemas/reviews";
import { Badge } from "@/components/ui/badge";
import { Section } from "@/components/ui/page";
import { ErrorState, TableSkeleton } from "@/components/ui/states";
import { LimitChipView } from "@/features/analysis/components/limit-chips";
import { ReleaseAction } from "@/features/releases/components/release-dialog";
import { WithdrawAction } from "@/features/releases/components/withdraw-dialog";
import { VerificationEvidence } from "@/features/verifications/components/release-verification";
import { formatDateTime } from "@/lib/format";
import { useDesignReleases } from "../api/get-design-releases";
import { useReviewPage } from "../api/get-review";
import { chipOf } from "../lib/figures";
import { CommentThread } from "./comment-thread";
import { DecisionForm } from "./decision-form";
import { FiguresTable } from "./figures-table";
import { HashText } from "./hash-text";

const DECISION_VIEW: Record<ReviewDecision, { label: string; tone: "pass" | "warn" }> = {
  approved: { label: "Approved", tone: "pass" },
  changes_requested: { label: "Changes requested", tone: "warn" },
};

function ReportSummaryView({ page }: { page: ReviewPage }) {
  const report = page.report;
  if (!report)
    return (
      <p className="text-sm text-ink-600">
        No finished report for this content yet.{" "}
        {page.revision.state === "draft" ? "Run the analysis, then submit the revision for review." : ""}
      </p>
    );
  const failing = report.limits.filter((l) => !l.pass).length;
  return (
    <div className="flex flex-col gap-3">
      <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-ink-800">
        <Badge tone={VERDICT_TONE[verdictOf(report)]}>
          {verdictOf(report) === "fail"
            ? `${failing} limit${failing === 1 ? "" : "s"} fail`
            : VERDICT_WORDS[verdictOf(report)]}
        </Badge>
        <span className="inline-flex items-center gap-1.5">
          Report hash <HashText value={report.reportHash} label="report hash" />
        </span>
        <span>
          finished <span className="font-mono">{formatDateTime(report.finishedAt)}</span>
        </span>
        <Link to={`/revisions/${page.revision.id}/report`} className="text-signal-800 underline">
          Open the full report
        </Link>
      </p>
      {report.limits.length === 0 ? (
        <p className="text-sm text-ink-600">No acceptance limits are set for this revision.</p>
      ) : (
        <ul aria-label="Acceptance limits" className="flex flex-wrap gap-1.5">
          {report.limits.map((l) => (
            <LimitChipView key={l.name} chip={chipOf(l)} />
          ))}
        </ul>
      )}
      <FiguresTable page={page} />
      {page.previousRelease ? (
        page.previousRelease.report === null && (
          <p className="text-xs text-ink-600">The previous release has no stored report to compare with.</p>
        )
      ) : (
        <p className="text-xs text-ink-600">No earlier release of this design to compare with.</p>
      )}
    </div>
  );
}

function Decisions({ page }: { page: ReviewPage }) {
  if (page.decisions.length === 0) return null;
  return (
    <ol
      aria-label="Decisions"
      className="flex flex-col divide-y divide-paper-200 rounded border border-paper-300 bg-paper-50"
    >
      {page.decisions.map((d) => (
        <li key={d.id} className="flex flex-col gap-0.5 px-3 py-2 text-sm">
          <p className="flex flex-wrap items-center gap-2 text-ink-800">
            <Badge tone={DECISION_VIEW[d.decision].tone}>{DECISION_VIEW[d.decision].label}</Badge>
            by {d.reviewer.displayName} ·{" "}
            <time dateTime={d.at} className="font-mono text-xs">
              {formatDateTime(d.at)}
            </time>
            <span className="text-xs text-ink-600">
              bound to content <span className="font-mono">{d.contentHash.slice(0, 12)}…</span>, report{" "}
              <span className="font-mono">{d.reportHash.slice(0, 12)}…</span>
            </span>
          </p>
          {d.comment && <p className="break-words whitespace-pre-wrap text-ink-900">{d.comment}</p>}
        </li>
      ))}
    </ol>
  );
}

/** The release of a released revision, with the withdraw action for those allowed. */
function ReleasedAs({ page, canWithdraw }: { page: ReviewPage; canWithdraw: boolean }) {
  const releases = useDesignReleases(page.design.id);
  const release = releases.data?.find((r) => r.revisionId === page.revision.id);
  if (!release) return null;
  return (
    <>
      <div className="flex flex-wrap items-center justify-between gap-2 rounded border border-paper-300 bg-paper-50 px-3 py-2 text-sm text-ink-800">
        <span>
          Released as{" "}
          <Link to={`/releases/${release.id}`} className="font-mono font-medium text-signal-800 underline">
            {release.version}
          </Link>{" "}
          by {release.releasedBy.displayName} on{" "}
          <span className="font-mono">{formatDateTime(release.releasedAt)}</span>
          {release.withdrawn && (
            <>
              {" "}
              · <Badge tone="fail">withdrawn</Badge> {release.withdrawn.reason}
            </>
          )}
        </span>
        {canWithdraw && <WithdrawAction release={release} />}
      </div>
      <VerificationEvidence releaseId={release.id} />
    </>
  );
}

/** The revision page's "Review" section: report verdict and figures, decisions, the decision form, the thread, release. */
export function ReviewSection({ revisionId }: { revisionId: number }) {
  const query = useReviewPage(revisionId);
  if (query.isPending)
    return (
      <Section title="Review">
        <TableSkeleton rows={3} label="Loading the review" />
      </Section>
    );
  if (query.isError)
    return (
      <Section title="Review">
        <ErrorState error={query.error} onRetry={() => void query.refetch()} />
      </Section>
    );
  const page = query.data;
  const { revision, design } = page;
  const allowed = new Set(page.allowedActions);
  const decisions = (["approved", "changes_requested"] as const).filter((d) =>
    allowed.has(d === "approved" ? "approve" : "request_changes"),
  );
  const release =
    allowed.has("release") && revision.contentHash ? (
      <ReleaseAction
        target={{
          revisionId: revision.id,
          revisionNumber: revision.number,
          designId: design.id,
          designName: design.name,
          designKind: design.kind,
          contentHash: revision.contentHash,
        }}
      />
    ) : undefined;
  return (
    <Section title="Review" action={release}>
      <div className="flex flex-col gap-4" data-testid="review-section">
        {revision.submittedAt && (
          <p className="text-sm text-ink-700">
            Submitted by {revision.submittedBy?.displayName ?? "—"} on{" "}
            <span className="font-mono">{formatDateTime(revision.submittedAt)}</span>
            {revision.contentHash && (
              <>
                {" "}
                · content hash <HashText value={revision.contentHash} label="submitted content hash" />
              </>
            )}
          </p>
        )}
        {revision.state === "released" && <ReleasedAs page={page} canWithdraw={allowed.has("withdraw")} />}
        <ReportSummaryView page={page} />
        <Decisions page={page} />
        {decisions.length > 0 && page.report && revision.contentHash ? (
          <DecisionForm
            revisionId={revision.id}
            revisionNumber={revision.number}
            contentHash={revision.contentHash}
            reportHash={page.report.reportHash}
            allowed={decisions}
          />
        ) : (
          revision.state === "in_review" &&
          revision.submittedBy && (
            <p className="text-sm text-ink-600">
              Waiting for a reviewer other than {revision.submittedBy.displayName} to decide.
            </p>
          )
        )}
        <div className="flex flex-col gap-2">
          <h3 className="text-xs font-semibold text-ink-700 uppercase">Comments</h3>
          <CommentThread
            revisionId={revision.id}
            comments={page.comments}
            canComment={allowed.has("comment")}
          />
        </div>
      </div>
    </Section>
  );
}
