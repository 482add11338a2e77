CREATE TYPE "public"."review_decision" AS ENUM('approved', 'changes_requested');--> statement-breakpoint
CREATE TABLE "releases" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "releases_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"design_id" integer NOT NULL,
	"revision_id" integer NOT NULL,
	"version" varchar(40) NOT NULL,
	"major" integer NOT NULL,
	"minor" integer NOT NULL,
	"patch" integer NOT NULL,
	"notes" text NOT NULL,
	"released_by" integer NOT NULL,
	"released_at" timestamp with time zone NOT NULL,
	"content_hash" text NOT NULL,
	"bundle" "bytea",
	"bundle_sha256" text,
	"bundle_size" integer,
	"manifest" jsonb,
	"withdrawn_at" timestamp with time zone,
	"withdrawn_by" integer,
	"withdraw_reason" text,
	CONSTRAINT "releases_design_version_unique" UNIQUE("design_id","version"),
	CONSTRAINT "releases_design_semver_unique" UNIQUE("design_id","major","minor","patch"),
	CONSTRAINT "releases_version_parts" CHECK ("releases"."version" = "releases"."major"::text || '.' || "releases"."minor"::text || '.' || "releases"."patch"::text),
	CONSTRAINT "releases_withdrawal_complete" CHECK (("releases"."withdrawn_at" is null) = ("releases"."withdrawn_by" is null) and ("releases"."withdrawn_at" is null) = ("releases"."withdraw_reason" is null))
);
--> statement-breakpoint
CREATE TABLE "review_comments" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "review_comments_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"revision_id" integer NOT NULL,
	"author_id" integer NOT NULL,
	"body" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "reviews_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"revision_id" integer NOT NULL,
	"content_hash" text NOT NULL,
	"report_hash" text NOT NULL,
	"decision" "review_decision" NOT NULL,
	"comment" text DEFAULT '' NOT NULL,
	"reviewer_id" integer NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "reviews_changes_need_comment" CHECK ("reviews"."decision" <> 'changes_requested' or length(btrim("reviews"."comment")) > 0)
);
--> statement-breakpoint
ALTER TABLE "releases" ADD CONSTRAINT "releases_design_id_designs_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."designs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "releases" ADD CONSTRAINT "releases_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "releases" ADD CONSTRAINT "releases_released_by_users_id_fk" FOREIGN KEY ("released_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "releases" ADD CONSTRAINT "releases_withdrawn_by_users_id_fk" FOREIGN KEY ("withdrawn_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comments" ADD CONSTRAINT "review_comments_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_comments" ADD CONSTRAINT "review_comments_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_reviewer_id_users_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "releases_revision_idx" ON "releases" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "review_comments_revision_idx" ON "review_comments" USING btree ("revision_id");--> statement-breakpoint
CREATE INDEX "reviews_revision_idx" ON "reviews" USING btree ("revision_id");