import { z } from "zod";

/** Who did it: a signed-in person, a script holding an API token, or the server itself. */
export const AUDIT_ACTOR_KINDS = ["user", "token", "system"] as const;
/** One of AUDIT_ACTOR_KINDS. */
export type AuditActorKind = (typeof AUDIT_ACTOR_KINDS)[number];

/** Dotted lower-case action names such as `auth.sign-in` or `revision.submit`. */
export const AuditActionSchema = z
  .string()
  .regex(/^[a-z][a-z0-9-]*(\.[a-z][a-z0-9-]*)+$/, "an action looks like area.verb, e.g. auth.sign-in");

/** One row of the audit trail as the API returns it. */
export const AuditEventSchema = z.object({
  id: z.number().int(),
  at: z.string(),
  actorUserId: z.number().int().nullable(),
  actorUsername: z.string().nullable(),
  actorKind: z.enum(AUDIT_ACTOR_KINDS),
  action: z.string(),
  projectId: z.number().int().nullable(),
  projectSlug: z.string().nullable(),
  subjectType: z.string().nullable(),
  subjectId: z.string().nullable(),
  summary: z.string(),
  details: z.record(z.string(), z.unknown()),
  ip: z.string().nullable(),
});
/** One audit row. */
export type AuditEvent = z.infer<typeof AuditEventSchema>;

const optionalId = z.preprocess(
  (v) => (v === "" || v === undefined ? undefined : v),
  z.coerce.number().int().positive().optional(),
);
const optionalInstant = z.preprocess(
  (v) => (v === "" || v === undefined ? undefined : v),
  z.iso.datetime({ offset: true }).optional(),
);

/**
 * Filters of the audit page and the CSV export (query-string form; empty strings mean "any"): `project` and
 * `user` are ids. Strict: an unknown parameter is a 400, not silently ignored.
 */
export const AuditFilterSchema = z.strictObject({
  project: optionalId,
  user: optionalId,
  /** An exact action, or a prefix ending in `.` (e.g. `auth.`) for a whole area. */
  action: z.preprocess(
    (v) => (v === "" ? undefined : v),
    z
      .string()
      .regex(/^[a-z][a-z0-9.-]*$/, "letters, digits, dots and dashes")
      .max(80)
      .optional(),
  ),
  from: optionalInstant,
  to: optionalInstant,
});
/** Parsed audit filters. */
export type AuditFilter = z.infer<typeof AuditFilterSchema>;

/** Filters plus keyset paging: rows with id below `before`, newest first. */
export const AuditPageQuerySchema = AuditFilterSchema.extend({
  before: optionalId,
  limit: z.preprocess(
    (v) => (v === "" || v === undefined ? undefined : v),
    z.coerce.number().int().min(1).max(200).default(50),
  ),
});
/** Parsed audit page query. */
export type AuditPageQuery = z.infer<typeof AuditPageQuerySchema>;

/** A page of audit rows; `nextBefore` is the cursor for the next (older) page, null at the end. */
export const AuditPageSchema = z.object({
  events: z.array(AuditEventSchema),
  nextBefore: z.number().int().nullable(),
});
/** One page of the audit trail. */
export type AuditPage = z.infer<typeof AuditPageSchema>;
