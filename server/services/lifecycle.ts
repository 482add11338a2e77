/**
 * The revision life cycle of DESIGN.md in one place (issue 6): a table of (state, action) → next state and
 * who may do it. Every review and release route asks `authorize` before it changes anything, so the rules
 * cannot drift apart between routes. Membership (404) is checked by the caller before this runs.
 */
import type { Role } from "../../shared/schemas/auth";
import type { RevisionState } from "../../shared/schemas/designs";
import { HttpError } from "../http/errors";
import type { Viewer } from "./projects";

/** What a user can do to a revision (withdraw acts on the revision's release). */
export const LIFECYCLE_ACTIONS = [
  "submit",
  "approve",
  "request_changes",
  "release",
  "withdraw",
  "comment",
] as const;
export type LifecycleAction = (typeof LIFECYCLE_ACTIONS)[number];

/** One row of the table. */
export interface LifecycleRule {
  /** States the action starts from. */
  from: readonly RevisionState[];
  /** The revision's state afterwards (null: unchanged). */
  to: RevisionState | null;
  /** Holding any one of these roles is enough. */
  roles: readonly Role[];
  /** Separation of duties: the user who submitted may not do this. */
  notSubmitter: boolean;
  /** Separation of duties: nobody who wrote any of the revision's content may do this. */
  notAuthor: boolean;
  /** How the action is named in messages. */
  words: string;
}

const AFTER_SUBMIT: readonly RevisionState[] = ["in_review", "approved", "changes_requested", "released"];

/** The table itself; changing the life cycle means changing this and nothing else. */
export const LIFECYCLE: Readonly<Record<LifecycleAction, LifecycleRule>> = {
  submit: {
    from: ["draft"],
    to: "in_review",
    roles: ["author"],
    notSubmitter: false,
    notAuthor: false,
    words: "submit it for review",
  },
  approve: {
    from: ["in_review"],
    to: "approved",
    roles: ["reviewer"],
    notSubmitter: true,
    notAuthor: true,
    words: "approve it",
  },
  request_changes: {
    from: ["in_review"],
    to: "changes_requested",
    roles: ["reviewer"],
    notSubmitter: true,
    notAuthor: true,
    words: "request changes",
  },
  release: {
    from: ["approved"],
    to: "released",
    roles: ["author"],
    notSubmitter: false,
    notAuthor: false,
    words: "release it",
  },
  // The revision stays `released`; the release row gets its withdrawal fields (a flag, not a state).
  withdraw: {
    from: ["released"],
    to: null,
    roles: ["author", "admin"],
    notSubmitter: false,
    notAuthor: false,
    words: "withdraw its release",
  },
  comment: {
    from: AFTER_SUBMIT,
    to: null,
    roles: ["author", "reviewer", "admin"],
    notSubmitter: false,
    notAuthor: false,
    words: "comment",
  },
};

/** Revision states in words, for messages. */
export const STATE_WORDS: Readonly<Record<RevisionState, string>> = {
  draft: "a draft",
  in_review: "in review",
  approved: "approved",
  changes_requested: "closed with changes requested",
  released: "released",
};

/** The revision facts the rules look at. */
export interface LifecycleSubject {
  number: number;
  state: RevisionState;
  submittedById: number | null;
  /** Everyone who wrote any of its content (server/services/authorship.ts). */
  authorIds: readonly number[];
}

/**
 * Why an action is refused, or null when it is allowed; the order is role (403), state (409), self-review (403:
 * the submitter, then any content author).
 */
export function refusal(
  action: LifecycleAction,
  subject: LifecycleSubject,
  viewer: Viewer,
): HttpError | null {
  const rule = LIFECYCLE[action];
  if (!rule.roles.some((r) => viewer.roles.includes(r)))
    return new HttpError(
      "forbidden",
      `Only a user with the ${rule.roles.join(" or ")} role may ${rule.words}`,
      {
        action,
      },
    );
  if (!rule.from.includes(subject.state))
    return new HttpError(
      "conflict",
      `r${subject.number} is ${STATE_WORDS[subject.state]}, so you cannot ${rule.words}`,
      {
        action,
        state: subject.state,
      },
    );
  if (rule.notSubmitter && subject.submittedById === viewer.id)
    return new HttpError("forbidden", "You submitted this revision, so someone else must review it", {
      action,
      reason: "self_review",
    });
  if (rule.notAuthor && subject.authorIds.includes(viewer.id))
    return new HttpError("forbidden", "You wrote content of this revision, so someone else must review it", {
      action,
      reason: "content_author",
    });
  return null;
}

/** The next state if the action is allowed; throws the refusal otherwise. */
export function authorize(action: LifecycleAction, subject: LifecycleSubject, viewer: Viewer): RevisionState {
  const refused = refusal(action, subject, viewer);
  if (refused) throw refused;
  return LIFECYCLE[action].to ?? subject.state;
}

/** The actions the viewer may take now (the client shows only these). */
export function allowedActions(subject: LifecycleSubject, viewer: Viewer): LifecycleAction[] {
  return LIFECYCLE_ACTIONS.filter((a) => refusal(a, subject, viewer) === null);
}
