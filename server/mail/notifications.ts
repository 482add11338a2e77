import { and, eq, ne } from "drizzle-orm";
import type { Role } from "../../shared/schemas/auth";
import type { MailTemplateName } from "../../shared/schemas/mail";
import { projectMembers, projects, userRoles, users } from "../db/schema";
import type { Executor } from "../services/audit";
import { enqueueMail } from "./outbox";
import type { MailCommon, MailData, MailVerificationRun } from "./templates";

/** Events that send mail, one per template. */
export type NotifyEvent = MailTemplateName;

/** What the caller (the review/release state machine) knows about the change. */
export interface NotifyBase {
  projectId: number;
  design: { id: number; name: string; kind: "waveform" | "filter" };
  revision: { id: number; number: number };
  /** The user who made the change (named in the mail). */
  actorUserId: number;
  /** The revision's author: the recipient of approved / changes-requested, never of submitted. */
  authorUserId: number;
  /** Absolute base URL of the app, e.g. env().PUBLIC_URL. */
  baseUrl: string;
}

/** The event-specific part of each notification. */
export interface NotifyExtra {
  submitted: { note?: string };
  approved: { comment?: string };
  "changes-requested": { comment: string };
  released: { release: { id: number; version: string; notes: string } };
  withdrawn: { release: { id: number; version: string }; reason: string };
  /** A verification run: mailed to the revision's author and the reviewers who approved it. */
  verified: { release: { id: number; version: string }; run: MailVerificationRun; reviewerUserIds: number[] };
}

/** Full context for one event. */
export type NotifyContext<E extends NotifyEvent> = NotifyBase & NotifyExtra[E];

/** Active members of a project holding a role, as e-mail addresses (sorted, for stable recipients). */
export async function memberAddressesWithRole(
  tx: Executor,
  projectId: number,
  role: Role,
  exceptUserId?: number,
): Promise<string[]> {
  const rows = await tx
    .select({ email: users.email })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .innerJoin(userRoles, and(eq(userRoles.userId, users.id), eq(userRoles.role, role)))
    .where(
      and(
        eq(projectMembers.projectId, projectId),
        eq(users.active, true),
        exceptUserId !== undefined ? ne(users.id, exceptUserId) : undefined,
      ),
    );
  return [...new Set(rows.map((r) => r.email))].sort();
}

async function activeAddressOf(tx: Executor, userId: number): Promise<string[]> {
  const rows = await tx
    .select({ email: users.email })
    .from(users)
    .where(and(eq(users.id, userId), eq(users.active, true)));
  return rows.map((r) => r.email);
}

/** Who receives each event (DESIGN.md "Mail"; issue 6). */
export async function recipientsFor(tx: Executor, event: NotifyEvent, c: NotifyBase): Promise<string[]> {
  switch (event) {
    case "submitted":
      // The author cannot review their own submission, so they are not asked to.
      return memberAddressesWithRole(tx, c.projectId, "reviewer", c.authorUserId);
    case "approved":
    case "changes-requested":
      return activeAddressOf(tx, c.authorUserId);
    case "released":
    case "withdrawn":
      return memberAddressesWithRole(tx, c.projectId, "firmware");
    case "verified": {
      const reviewers = (c as NotifyContext<"verified">).reviewerUserIds;
      const all = await Promise.all(
        [c.authorUserId, ...reviewers]
          .filter((id) => id !== c.actorUserId)
          .map((id) => activeAddressOf(tx, id)),
      );
      return [...new Set(all.flat())].sort();
    }
  }
}

function trimSlash(url: string): string {
  return url.replace(/\/+$/, "");
}

async function commonData(tx: Executor, c: NotifyBase, link: string): Promise<MailCommon> {
  const [project] = await tx
    .select({ name: projects.name, slug: projects.slug })
    .from(projects)
    .where(eq(projects.id, c.projectId));
  const [actor] = await tx
    .select({ displayName: users.displayName })
    .from(users)
    .where(eq(users.id, c.actorUserId));
  if (!project) throw new Error(`notify: project ${c.projectId} does not exist`);
  if (!actor) throw new Error(`notify: user ${c.actorUserId} does not exist`);
  return {
    appName: "Tapwright",
    link,
    project,
    design: { name: c.design.name, kind: c.design.kind },
    revision: { number: c.revision.number },
    actor,
  };
}

/** The template data of one event. */
async function dataFor<E extends NotifyEvent>(
  tx: Executor,
  event: E,
  c: NotifyContext<E>,
): Promise<MailData[E]> {
  const base = trimSlash(c.baseUrl);
  // Narrowing on a generic parameter needs a widened view of the context.
  const any = c as NotifyContext<NotifyEvent> & Partial<NotifyExtra[keyof NotifyExtra]>;
  const revisionLink = `${base}/revisions/${c.revision.id}`;
  switch (event) {
    case "submitted": {
      const x = any as NotifyContext<"submitted">;
      return { ...(await commonData(tx, c, revisionLink)), note: x.note ?? "" } as MailData[E];
    }
    case "approved":
    case "changes-requested": {
      const x = any as NotifyContext<"approved">;
      return { ...(await commonData(tx, c, revisionLink)), comment: x.comment ?? "" } as MailData[E];
    }
    case "released": {
      const x = any as NotifyContext<"released">;
      const release = { version: x.release.version, notes: x.release.notes };
      return { ...(await commonData(tx, c, `${base}/releases/${x.release.id}`)), release } as MailData[E];
    }
    case "withdrawn": {
      const x = any as NotifyContext<"withdrawn">;
      const data = await commonData(tx, c, `${base}/releases/${x.release.id}`);
      return { ...data, release: { version: x.release.version }, reason: x.reason } as MailData[E];
    }
    case "verified": {
      const x = any as NotifyContext<"verified">;
      const data = await commonData(tx, c, `${base}/releases/${x.release.id}`);
      return { ...data, release: { version: x.release.version }, run: x.run } as MailData[E];
    }
  }
  throw new RangeError(`unknown notification event "${String(event)}"`);
}

/**
 * Resolve the recipients of an event from project membership and roles, render its template and put
 * it in the outbox, all in the caller's transaction. Returns the outbox id, or null when nobody is to
 * be told (e.g. a project without firmware engineers).
 */
export async function notify<E extends NotifyEvent>(
  tx: Executor,
  event: E,
  context: NotifyContext<E>,
): Promise<number | null> {
  const to = await recipientsFor(tx, event, context);
  if (to.length === 0) return null;
  return enqueueMail(tx, { template: event, to, data: await dataFor(tx, event, context) });
}
