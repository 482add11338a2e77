CREATE TYPE "public"."analysis_state" AS ENUM('queued', 'running', 'done', 'failed');--> statement-breakpoint
CREATE TABLE "analysis_reports" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "analysis_reports_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"content_hash" text NOT NULL,
	"revision_id" integer NOT NULL,
	"state" "analysis_state" DEFAULT 'queued' NOT NULL,
	"progress" double precision DEFAULT 0 NOT NULL,
	"stage" text,
	"error" text,
	"report" jsonb,
	"report_version" integer,
	"software_version" text,
	"attempts" integer DEFAULT 0 NOT NULL,
	"queued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	"duration_ms" integer,
	CONSTRAINT "analysis_reports_content_hash_unique" UNIQUE("content_hash"),
	CONSTRAINT "analysis_reports_progress_range" CHECK ("analysis_reports"."progress" >= 0 and "analysis_reports"."progress" <= 1),
	CONSTRAINT "analysis_reports_done_has_report" CHECK ("analysis_reports"."state" <> 'done' or "analysis_reports"."report" is not null)
);
--> statement-breakpoint
ALTER TABLE "analysis_reports" ADD CONSTRAINT "analysis_reports_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "analysis_reports_revision_idx" ON "analysis_reports" USING btree ("revision_id");