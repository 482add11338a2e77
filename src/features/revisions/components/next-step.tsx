/**
 * The top of the revision page: where the revision stands, the last review decision with its comment, and the
 * one thing to do next (run the analysis, submit, start the next revision, decide, release), so nobody has to
 * scroll to the review thread to find out why a revision came back.
 */
import { Link, useNavigate } from "react-router-dom";
import type { RevisionDetail } from "@shared/schemas/designs";
import type { Review } from "@shared/schemas/reviews";
import { Button } from "@/components/ui/button";
import { useAnalysis } from "@/features/analysis/api/get-analysis";
import { useRunAnalysis } from "@/features/analysis/api/run-analysis";
import { useMe } from "@/features/auth/api/get-me";
import { openDraftId, useStartRevision } from "@/features/designs/api/get-design";
import { useReviewPage } from "@/features/reviews/api/get-review";
import { SubmitForReview } from "@/features/reviews/components/submit-for-review";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";
import { hasAnyRole } from "@/lib/roles";

const ANCHOR = "text-sm font-medium text-signal-800 underline hover:text-signal-900";

function StartNext({ detail }: { detail: RevisionDetail }) {
  const start = useStartRevision(detail.design.id);
  const navigate = useNavigate();
  const draft =
    start.error instanceof ApiError && start.error.status === 409
      ? openDraftId(start.error.details)
      : undefined;
  return (
    <div className="flex flex-col items-end gap-1">
      <Button
        variant="primary"
        busy={start.isPending}
        onClick={() => start.mutate(undefined, { onSuccess: (r) => navigate(`/revisions/${r.revision.id}`) })}
      >
        Start revision r{detail.revision.number + 1}
      </Button>
      {start.isError && (
        <p role="alert" className="text-xs text-fail-700">
          {start.error.message}{" "}
          {draft !== undefined && (
            <Link to={`/revisions/${draft}`} className="underline">
              Open the draft
            </Link>
          )}
        </p>
      )}
    </div>
  );
}

function RunFirst({ revisionId, busy }: { revisionId: number; busy: boolean }) {
  const run = useRunAnalysis(revisionId);
  return (
    <div className="flex flex-col items-end gap-1">
      <Button variant="primary" busy={run.isPending || busy} onClick={() => run.mutate()}>
        {busy ? "Analysing…" : "Run analysis"}
      </Button>
      {run.isError && (
        <p role="alert" className="text-xs text-fail-700">
          {run.error.message}
        </p>
      )}
    </div>
  );
}

/** The page's one primary action for this user and this revision's state. */
export function NextAction({ detail, blocked }: { detail: RevisionDetail; blocked: boolean }) {
  const me = useMe();
  const analysis = useAnalysis(detail.revision.id);
  const review = useReviewPage(detail.revision.id);
  const roles = me.data?.roles ?? [];
  const state = detail.revision.state;
  const allowed = new Set(review.data?.allowedActions ?? []);
  if (state === "draft" && detail.canEdit) {
    const a = analysis.data;
    if (a && a.state === "done") return <SubmitForReview detail={detail} blocked={blocked} />;
    if (analysis.isPending) return null;
    return (
      <RunFirst revisionId={detail.revision.id} busy={a?.state === "queued" || a?.state === "running"} />
    );
  }
  if (state === "changes_requested" && hasAnyRole(roles, ["author"])) return <StartNext detail={detail} />;
  if (state === "in_review" && (allowed.has("approve") || allowed.has("request_changes")))
    return (
      <a href="#review" className={ANCHOR}>
        Review and decide
      </a>
    );
  if (state === "approved" && allowed.has("release"))
    return (
      <a href="#review" className={ANCHOR}>
        Release it
      </a>
    );
  return null;
}

const DECISION_WORDS: Record<Review["decision"], string> = {
  approved: "Approved",
  changes_requested: "Changes requested",
};

/** The newest decision on this revision, with its comment in full (it says what to change). */
export function LastDecision({ revisionId }: { revisionId: number }) {
  const review = useReviewPage(revisionId);
  const last = review.data?.decisions.at(-1);
  if (!last) return null;
  const changes = last.decision === "changes_requested";
  return (
    <figure
      aria-label="Last review decision"
      className={cn(
        "mb-5 rounded border px-4 py-3 text-sm",
        changes ? "border-warn-100 bg-warn-50 text-warn-800" : "border-pass-100 bg-pass-50 text-pass-700",
      )}
    >
      <figcaption className="font-medium">
        {DECISION_WORDS[last.decision]} by {last.reviewer.displayName} on{" "}
        <span className="font-mono">{formatDateTime(last.at)}</span>
      </figcaption>
      {last.comment ? (
        <blockquote className="mt-1 whitespace-pre-wrap text-ink-900">{last.comment}</blockquote>
      ) : (
        <p className="mt-1 text-ink-700">No comment.</p>
      )}
      {changes && (
        <p className="mt-1 text-xs text-ink-700">
          A revision that came back is read-only: start the next revision to make the change.
        </p>
      )}
    </figure>
  );
}

/** History entries from the review decisions (the revision page's History list). */
export function DecisionHistory({ revisionId }: { revisionId: number }) {
  const review = useReviewPage(revisionId);
  return (
    <>
      {(review.data?.decisions ?? []).map((d) => (
        <li key={d.id}>
          <span className="font-mono">{formatDateTime(d.at)}</span> ·{" "}
          {DECISION_WORDS[d.decision].toLowerCase()} by {d.reviewer.displayName}
        </li>
      ))}
    </>
  );
}
