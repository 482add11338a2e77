-- Content authors of the revisions written before revision_authors existed: the creator, every editor of the
-- draft (audit rows revision.update), and the uploader of the file the content uses.
INSERT INTO "revision_authors" ("revision_id", "user_id", "first_at")
SELECT "id", "created_by", "created_at" FROM "revisions"
ON CONFLICT DO NOTHING;
--> statement-breakpoint
INSERT INTO "revision_authors" ("revision_id", "user_id", "first_at")
SELECT r."id", a."actor_user_id", min(a."at")
FROM "audit_events" a
JOIN "revisions" r ON a."subject_type" = 'revision' AND a."subject_id" = r."id"::text
WHERE a."action" = 'revision.update' AND a."actor_user_id" IS NOT NULL
GROUP BY r."id", a."actor_user_id"
ON CONFLICT DO NOTHING;
--> statement-breakpoint
INSERT INTO "revision_authors" ("revision_id", "user_id", "first_at")
SELECT r."id", u."uploaded_by", r."created_at"
FROM "revisions" r
JOIN "uploads" u ON u."id" = coalesce(r."content" #>> '{tx,uploadId}', r."content" #>> '{fir,uploadId}')::integer
WHERE coalesce(r."content" #>> '{tx,kind}', r."content" #>> '{fir,kind}') = 'upload'
ON CONFLICT DO NOTHING;
--> statement-breakpoint
-- A revision started from another carries the other's authors (ancestors first, so chains fill in order).
WITH RECURSIVE chain AS (
  SELECT "id", "parent_revision_id" AS ancestor FROM "revisions" WHERE "parent_revision_id" IS NOT NULL
  UNION
  SELECT c."id", p."parent_revision_id" FROM chain c JOIN "revisions" p ON p."id" = c.ancestor
  WHERE p."parent_revision_id" IS NOT NULL
)
INSERT INTO "revision_authors" ("revision_id", "user_id", "first_at")
SELECT c."id", ra."user_id", min(ra."first_at")
FROM chain c JOIN "revision_authors" ra ON ra."revision_id" = c.ancestor
GROUP BY c."id", ra."user_id"
ON CONFLICT DO NOTHING;
