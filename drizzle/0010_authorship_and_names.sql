CREATE TABLE "revision_authors" (
	"revision_id" integer NOT NULL,
	"user_id" integer NOT NULL,
	"first_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "revision_authors_revision_id_user_id_pk" PRIMARY KEY("revision_id","user_id")
);
--> statement-breakpoint
ALTER TABLE "designs" DROP CONSTRAINT "designs_project_name_unique";--> statement-breakpoint
ALTER TABLE "revision_authors" ADD CONSTRAINT "revision_authors_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_authors" ADD CONSTRAINT "revision_authors_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "projects_name_ci_unique" ON "projects" USING btree (lower("name"));--> statement-breakpoint
CREATE UNIQUE INDEX "designs_project_name_ci_unique" ON "designs" USING btree ("project_id",lower("name"));