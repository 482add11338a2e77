import { useState } from "react";
import { CommentInputSchema, type ReviewComment } from "@shared/schemas/reviews";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { isSubmitChord, TextArea } from "@/components/ui/text-area";
import { fieldErrors } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";
import { usePostComment } from "../api/post-comment";

/**
 * The revision's comment thread, oldest first so the newest is last, and the box to add one.
 * Bodies are plain text: React escapes them and `whitespace-pre-wrap` keeps the writer's line breaks.
 */
export function CommentThread({
  revisionId,
  comments,
  canComment,
}: {
  revisionId: number;
  comments: ReviewComment[];
  canComment: boolean;
}) {
  const [body, setBody] = useState("");
  const [touched, setTouched] = useState(false);
  const post = usePostComment(revisionId);
  const parsed = CommentInputSchema.safeParse({ body });
  const localError = touched && !parsed.success ? parsed.error.issues[0]?.message : undefined;
  const error = localError ?? fieldErrors(post.error).body ?? (post.isError ? post.error.message : undefined);

  const send = () => {
    setTouched(true);
    if (!parsed.success || post.isPending) return;
    post.mutate(parsed.data, {
      onSuccess: () => {
        // Cleared only once the server has it: a failed post keeps what was typed.
        setBody("");
        setTouched(false);
      },
    });
  };

  return (
    <div className="flex flex-col gap-3">
      {comments.length === 0 ? (
        <p className="text-sm text-ink-600">No comments yet.</p>
      ) : (
        <ol
          aria-label="Comments"
          className="flex flex-col divide-y divide-paper-200 rounded border border-paper-300 bg-paper-50"
        >
          {comments.map((c) => (
            <li key={c.id} className="px-3 py-2">
              <p className="mb-0.5 text-xs text-ink-600">
                <span className="font-medium text-ink-800">{c.author.displayName}</span> ·{" "}
                <time dateTime={c.at} className="font-mono">
                  {formatDateTime(c.at)}
                </time>
              </p>
              <p className="text-sm break-words whitespace-pre-wrap text-ink-900">{c.body}</p>
            </li>
          ))}
        </ol>
      )}
      {canComment && (
        <form
          className="flex flex-col gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            send();
          }}
        >
          <Field label="Add a comment" hint="Plain text. Ctrl+Enter posts it." error={error}>
            {({ id, describedBy, invalid }) => (
              <TextArea
                id={id}
                rows={3}
                value={body}
                aria-describedby={describedBy}
                invalid={invalid}
                onChange={(e) => setBody(e.target.value)}
                onKeyDown={(e) => {
                  if (isSubmitChord(e)) {
                    e.preventDefault();
                    send();
                  }
                }}
              />
            )}
          </Field>
          <div>
            <Button type="submit" size="sm" busy={post.isPending}>
              Post comment
            </Button>
          </div>
        </form>
      )}
    </div>
  );
}
