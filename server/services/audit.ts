import { and, desc, eq, gte, like, lt, lte, sql, type SQL } from "drizzle-orm";
import { AsyncLocalStorage } from "node:async_hooks";
import type { Request, RequestHandler } from "express";
import type {
  AuditActorKind,
  AuditEvent,
  AuditFilter,
  AuditPage,
  AuditPageQuery,
} from "../../shared/schemas/audit";
import { AuditActionSchema } from "../../shared/schemas/audit";
import type { Db } from "../db/client";
import { auditEvents, projects, users } from "../db/schema";

/** A database handle or an open transaction: audit rows go in the caller's transaction. */
export type Executor = Db | Parameters<Parameters<Db["transaction"]>[0]>[0];

/** Who acted, as recorded on each row. */
export interface AuditActor {
  kind: AuditActorKind;
  userId: number | null;
  ip?: string | null;
}

/** What happened; `action` is dotted lower case (`auth.sign-in`, `revision.submit`). */
export interface AuditInput {
  /** Defaults to the user and address of the HTTP request being served, or the system outside one. */
  actor?: AuditActor;
  action: string;
  summary: string;
  projectId?: number | null;
  subjectType?: string | null;
  subjectId?: string | number | null;
  details?: Record<string, unknown>;
}

/** The actor of an HTTP request: the signed-in user (or nobody), with the client address. */
export function actorFrom(req: Request, kind: AuditActorKind = "user"): AuditActor {
  return { kind, userId: req.user?.id ?? null, ip: req.ip ?? null };
}

/** The server acting on its own (dispatcher, jobs, seed). */
export const SYSTEM_ACTOR: AuditActor = { kind: "system", userId: null, ip: null };

// The request being served, so services deep below a route can audit who and from where without
// every signature carrying the request. The request is read when the row is written (passport sets
// req.user after this middleware runs).
const currentRequest = new AsyncLocalStorage<Request>();

/** Middleware that makes the request's actor available to recordAudit; mount it before the routes. */
export const auditRequestContext: RequestHandler = (req, _res, next) => {
  currentRequest.run(req, next);
};

/** The actor of the request being served, or the system when there is none. */
export function currentActor(): AuditActor {
  const req = currentRequest.getStore();
  return req ? actorFrom(req) : SYSTEM_ACTOR;
}

/**
 * Append one audit row in the caller's transaction, so the row exists exactly when the change committed.
 * Returns the new row's id.
 */
export async function recordAudit(tx: Executor, event: AuditInput): Promise<number> {
  // Checked here too so a typo fails in the caller's test rather than as a bare CHECK violation.
  AuditActionSchema.parse(event.action);
  const actor = event.actor ?? currentActor();
  const [row] = await tx
    .insert(auditEvents)
    .values({
      actorKind: actor.kind,
      actorUserId: actor.userId,
      ip: actor.ip ?? null,
      action: event.action,
      summary: event.summary,
      projectId: event.projectId ?? null,
      subjectType: event.subjectType ?? null,
      subjectId: event.subjectId === undefined || event.subjectId === null ? null : String(event.subjectId),
      details: event.details ?? {},
    })
    .returning({ id: auditEvents.id });
  if (!row) throw new Error("audit insert returned no row");
  return row.id;
}

/** The WHERE clause for a filter; an action ending in "." matches the whole area. */
export function auditWhere(f: AuditFilter): SQL | undefined {
  const parts: SQL[] = [];
  if (f.project !== undefined) parts.push(eq(auditEvents.projectId, f.project));
  if (f.user !== undefined) parts.push(eq(auditEvents.actorUserId, f.user));
  if (f.action !== undefined) {
    // The filter schema allows only [a-z0-9.-], so no LIKE metacharacters can reach the pattern.
    parts.push(
      f.action.endsWith(".") ? like(auditEvents.action, `${f.action}%`) : eq(auditEvents.action, f.action),
    );
  }
  if (f.from !== undefined) parts.push(gte(auditEvents.at, new Date(f.from)));
  if (f.to !== undefined) parts.push(lte(auditEvents.at, new Date(f.to)));
  return parts.length > 0 ? and(...parts) : undefined;
}

const selection = {
  id: auditEvents.id,
  at: auditEvents.at,
  actorUserId: auditEvents.actorUserId,
  actorUsername: users.username,
  actorKind: auditEvents.actorKind,
  action: auditEvents.action,
  projectId: auditEvents.projectId,
  projectSlug: projects.slug,
  subjectType: auditEvents.subjectType,
  subjectId: auditEvents.subjectId,
  summary: auditEvents.summary,
  details: auditEvents.details,
  ip: auditEvents.ip,
};

async function selectEvents(db: Db, where: SQL | undefined, limit: number): Promise<AuditEvent[]> {
  const rows = await db
    .select(selection)
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorUserId))
    .leftJoin(projects, eq(projects.id, auditEvents.projectId))
    .where(where)
    .orderBy(desc(auditEvents.id))
    .limit(limit);
  return rows.map((r) => ({ ...r, at: r.at.toISOString(), details: r.details ?? {} }));
}

/** One page, newest first, keyset on id: stable while new rows arrive, and no OFFSET scans. */
export async function listAudit(db: Db, q: AuditPageQuery): Promise<AuditPage> {
  const where = and(auditWhere(q), q.before !== undefined ? lt(auditEvents.id, q.before) : undefined);
  // One extra row tells whether an older page exists.
  const rows = await selectEvents(db, where, q.limit + 1);
  const events = rows.slice(0, q.limit);
  const last = events.at(-1);
  return { events, nextBefore: rows.length > q.limit && last ? last.id : null };
}

/** Every matching row, newest first, in batches (for the CSV export). */
export async function* iterateAudit(db: Db, f: AuditFilter, batch = 1000): AsyncGenerator<AuditEvent> {
  let before: number | undefined;
  for (;;) {
    const where = and(auditWhere(f), before !== undefined ? lt(auditEvents.id, before) : undefined);
    const rows = await selectEvents(db, where, batch);
    yield* rows;
    const last = rows.at(-1);
    if (rows.length < batch || !last) return;
    before = last.id;
  }
}

/** Distinct action names seen so far, for the filter's suggestions. */
export async function auditActions(db: Db): Promise<string[]> {
  const rows = await db
    .selectDistinct({ action: auditEvents.action })
    .from(auditEvents)
    .orderBy(auditEvents.action);
  return rows.map((r) => r.action);
}

/** Count rows matching a filter (tests and the admin home). */
export async function countAudit(db: Db, f: AuditFilter = {}): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(auditEvents)
    .where(auditWhere(f));
  return row?.n ?? 0;
}
