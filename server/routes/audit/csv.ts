import type { AuditEvent } from "../../../shared/schemas/audit";

/** One CSV field per RFC 4180 §2: quoted when it holds a comma, quote, CR or LF; quotes doubled. */
export function csvField(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return "";
  const s = String(value);
  return /[",\r\n]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s;
}

/** One CSV record, CRLF-terminated as RFC 4180 §2 rule 1 asks. */
export function csvRecord(fields: readonly (string | number | null | undefined)[]): string {
  return `${fields.map(csvField).join(",")}\r\n`;
}

/** Column names of the audit export, in order. */
export const AUDIT_CSV_HEADER = [
  "id",
  "at",
  "actor_kind",
  "actor_user_id",
  "actor_username",
  "action",
  "project_id",
  "project_slug",
  "subject_type",
  "subject_id",
  "summary",
  "details",
  "ip",
] as const;

/** One audit row as a CSV record (details as compact JSON). */
export function auditCsvRecord(e: AuditEvent): string {
  return csvRecord([
    e.id,
    e.at,
    e.actorKind,
    e.actorUserId,
    e.actorUsername,
    e.action,
    e.projectId,
    e.projectSlug,
    e.subjectType,
    e.subjectId,
    e.summary,
    JSON.stringify(e.details),
    e.ip,
  ]);
}
