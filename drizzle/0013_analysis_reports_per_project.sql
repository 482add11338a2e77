ALTER TABLE "analysis_reports" DROP CONSTRAINT "analysis_reports_content_hash_unique";--> statement-breakpoint
ALTER TABLE "analysis_reports" ADD COLUMN "project_id" integer;--> statement-breakpoint
-- Each existing report belongs to the project of the revision that asked for it.
UPDATE "analysis_reports" a SET "project_id" = d."project_id"
FROM "revisions" r JOIN "designs" d ON d."id" = r."design_id"
WHERE r."id" = a."revision_id";--> statement-breakpoint
-- Another project whose submitted revision has the same content keeps its report: a copy of its own.
INSERT INTO "analysis_reports" ("project_id", "content_hash", "revision_id", "state", "progress", "stage", "error",
  "report", "report_version", "software_version", "attempts", "queued_at", "started_at", "finished_at", "duration_ms")
SELECT DISTINCT ON (d."project_id", a."content_hash") d."project_id", a."content_hash", r."id", a."state",
  a."progress", a."stage", a."error", a."report", a."report_version", a."software_version", a."attempts",
  a."queued_at", a."started_at", a."finished_at", a."duration_ms"
FROM "analysis_reports" a
JOIN "revisions" r ON r."content_hash" = a."content_hash"
JOIN "designs" d ON d."id" = r."design_id"
WHERE d."project_id" <> a."project_id"
  AND NOT EXISTS (SELECT 1 FROM "analysis_reports" b WHERE b."project_id" = d."project_id" AND b."content_hash" = a."content_hash")
ORDER BY d."project_id", a."content_hash", r."id";--> statement-breakpoint
ALTER TABLE "analysis_reports" ALTER COLUMN "project_id" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "analysis_reports" ADD CONSTRAINT "analysis_reports_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "analysis_reports_hash_idx" ON "analysis_reports" USING btree ("content_hash");--> statement-breakpoint
ALTER TABLE "analysis_reports" ADD CONSTRAINT "analysis_reports_project_hash_unique" UNIQUE("project_id","content_hash");
