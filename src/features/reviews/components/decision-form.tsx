import { useState } from "react";
import { DecisionInputSchema, type ReviewDecision } from "@shared/schemas/reviews";
import { Button } from "@/components/ui/button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { isSubmitChord, TextArea } from "@/components/ui/text-area";
import { useToast } from "@/components/ui/toast";
import { fieldErrors } from "@/lib/api-client";
import { useDecide } from "../api/decide";
import { shortHash } from "../lib/figures";

const WORDS: Record<ReviewDecision, { option: string; verb: string; done: string }> = {
  approved: { option: "Approve", verb: "Approve", done: "approved" },
  changes_requested: {
    option: "Request changes",
    verb: "Request changes to",
    done: "sent back with changes requested",
  },
};

/**
 * The reviewer's decision: approve or request changes (a comment is then required), confirmed in a dialog
 * that names the content hash and report hash the decision is bound to.
 */
export function DecisionForm({
  revisionId,
  revisionNumber,
  contentHash,
  reportHash,
  allowed,
}: {
  revisionId: number;
  revisionNumber: number;
  contentHash: string;
  reportHash: string;
  allowed: readonly ReviewDecision[];
}) {
  const [decision, setDecision] = useState<ReviewDecision | null>(null);
  const [comment, setComment] = useState("");
  const [tried, setTried] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const decide = useDecide(revisionId);
  const toast = useToast();
  const r = `r${revisionNumber}`;

  const parsed = decision ? DecisionInputSchema.safeParse({ decision, comment }) : null;
  const localIssues = parsed && !parsed.success ? parsed.error.issues : [];
  const commentError =
    (tried ? localIssues.find((i) => i.path[0] === "comment")?.message : undefined) ??
    fieldErrors(decide.error).comment;
  const decisionError = tried && !decision ? "choose approve or request changes" : undefined;

  const review = () => {
    setTried(true);
    if (parsed?.success) setConfirming(true);
  };

  return (
    <>
      <form
        aria-label="Decision"
        className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 px-4 py-3"
        onSubmit={(e) => {
          e.preventDefault();
          review();
        }}
      >
        <fieldset className="flex flex-col gap-1">
          <legend className="mb-1 text-xs font-medium text-ink-700">Decision</legend>
          <div className="flex flex-wrap gap-4">
            {(["approved", "changes_requested"] as const)
              .filter((d) => allowed.includes(d))
              .map((d) => (
                <label key={d} className="inline-flex items-center gap-1.5 text-sm text-ink-900">
                  <input
                    type="radio"
                    name="decision"
                    value={d}
                    checked={decision === d}
                    onChange={() => setDecision(d)}
                    className="accent-signal-700"
                  />
                  {WORDS[d].option}
                </label>
              ))}
          </div>
          {decisionError && (
            <p role="alert" className="text-xs text-fail-700">
              {decisionError}
            </p>
          )}
        </fieldset>
        <Field
          label={decision === "changes_requested" ? "What needs to change (required)" : "Comment"}
          hint="Plain text, kept with the decision. Ctrl+Enter records it."
          error={commentError}
        >
          {({ id, describedBy, invalid }) => (
            <TextArea
              id={id}
              rows={3}
              value={comment}
              aria-describedby={describedBy}
              invalid={invalid}
              onChange={(e) => setComment(e.target.value)}
              onKeyDown={(e) => {
                if (isSubmitChord(e)) {
                  e.preventDefault();
                  review();
                }
              }}
            />
          )}
        </Field>
        <div>
          <Button type="submit" variant="primary">
            Record decision…
          </Button>
        </div>
      </form>
      <Dialog
        open={confirming && decision !== null}
        onClose={() => {
          setConfirming(false);
          decide.reset();
        }}
        title={decision ? `${WORDS[decision].verb} ${r}?` : ""}
        footer={
          <DialogActions
            onCancel={() => setConfirming(false)}
            label={decision ? `${WORDS[decision].option}` : "Confirm"}
            variant={decision === "changes_requested" ? "danger" : "primary"}
            busy={decide.isPending}
            onConfirm={() => {
              if (!parsed?.success) return;
              decide.mutate(parsed.data, {
                onSuccess: () => {
                  setConfirming(false);
                  setComment("");
                  setDecision(null);
                  setTried(false);
                  toast(
                    `${r} ${decision ? WORDS[decision].done : ""}`,
                    decision === "approved" ? "pass" : "neutral",
                  );
                },
              });
            }}
          />
        }
      >
        <div className="flex flex-col gap-2 text-sm text-ink-800">
          <p>
            Your decision is bound to content hash{" "}
            <span className="font-mono" title={contentHash}>
              {shortHash(contentHash)}
            </span>{" "}
            and report hash{" "}
            <span className="font-mono" title={reportHash}>
              {shortHash(reportHash)}
            </span>
            . It names exactly the coefficients, spec and figures you read.
          </p>
          <p>
            A decision cannot be changed afterwards. Any change to the content needs a new revision and a new
            review.
          </p>
          {decide.isError && (
            <p role="alert" className="text-fail-700">
              {decide.error.message}
            </p>
          )}
        </div>
      </Dialog>
    </>
  );
}
