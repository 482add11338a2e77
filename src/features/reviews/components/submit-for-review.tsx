import { useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import type { RevisionDetail } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { useToast } from "@/components/ui/toast";
import { useAnalysis } from "@/features/analysis/api/get-analysis";
import { homeKeys } from "@/features/home/api/get-home";
import { useSubmitRevision } from "@/features/revisions/api/submit-revision";
import { reviewKeys } from "../api/keys";
import { shortHash } from "../lib/figures";

/**
 * "Submit for review" on a draft, under the life-cycle rules: it needs a finished analysis report for the
 * draft's current content (the server refuses with 409 `no_report` otherwise) and no unsaved edits.
 */
export function SubmitForReview({ detail, blocked }: { detail: RevisionDetail; blocked: boolean }) {
  const [open, setOpen] = useState(false);
  // No acceptance limits: the report judged nothing, so submitting asks for an explicit yes.
  const unjudged = Object.values(detail.content.limits ?? {}).every((v) => v === undefined);
  const [withoutLimits, setWithoutLimits] = useState(false);
  const analysis = useAnalysis(detail.revision.id);
  const submit = useSubmitRevision(detail.revision.id);
  const qc = useQueryClient();
  const toast = useToast();
  const r = `r${detail.revision.number}`;
  const done = analysis.data?.state === "done";
  const reason = blocked ? "Save or discard your edits first" : !done ? "Run the analysis first" : undefined;
  return (
    <div className="flex flex-col items-end gap-1">
      <Button
        variant="primary"
        onClick={() => setOpen(true)}
        disabled={reason !== undefined}
        aria-describedby={reason ? "submit-blocked" : undefined}
      >
        Submit for review
      </Button>
      {reason && !analysis.isPending && (
        <p id="submit-blocked" className="text-xs text-ink-700">
          {reason}
        </p>
      )}
      <Dialog
        open={open}
        onClose={() => {
          setOpen(false);
          submit.reset();
        }}
        title={`Submit ${r} for review?`}
        footer={
          <DialogActions
            onCancel={() => setOpen(false)}
            label={unjudged ? `Submit ${r} without limits` : `Submit ${r}`}
            busy={submit.isPending}
            disabled={unjudged && !withoutLimits}
            onConfirm={() =>
              submit.mutate(undefined, {
                onSuccess: () => {
                  setOpen(false);
                  void qc.invalidateQueries({ queryKey: reviewKeys.all });
                  void qc.invalidateQueries({ queryKey: homeKeys.all });
                  toast(`${r} is in review`, "pass");
                },
              })
            }
          />
        }
      >
        <div className="flex flex-col gap-2 text-sm text-ink-800">
          {unjudged && (
            <div role="note" className="rounded border border-warn-100 bg-warn-50 px-3 py-2 text-warn-800">
              <p className="font-medium">Not judged: {r} has no acceptance limits.</p>
              <p>
                The report measures every figure but checks none, so the reviewer has nothing to hold it to.
                Set limits on the revision page, or confirm that this is intended.
              </p>
              <label className="mt-2 flex items-center gap-2 text-ink-900">
                <input
                  type="checkbox"
                  className="accent-signal-700"
                  checked={withoutLimits}
                  onChange={(e) => setWithoutLimits(e.target.checked)}
                />
                Submit without acceptance limits
              </label>
            </div>
          )}
          <p>This cannot be undone:</p>
          <ul className="list-disc pl-5">
            <li>
              The content of {r} (its coefficient tables, fixed-point spec and acceptance limits) is frozen
              and its content hash is fixed
              {analysis.data?.state === "done" ? (
                <>
                  {" "}
                  as <span className="font-mono">{shortHash(analysis.data.contentHash)}</span>
                </>
              ) : null}
              .
            </li>
            <li>The project&rsquo;s reviewers are notified by mail; someone other than you must decide.</li>
            <li>
              Any later change needs a new revision, r{detail.revision.number + 1}, copied from this one.
            </li>
          </ul>
          {submit.isError && (
            <p role="alert" className="text-fail-700">
              {submit.error.message}
            </p>
          )}
        </div>
      </Dialog>
    </div>
  );
}
