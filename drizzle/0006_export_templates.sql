CREATE TABLE "export_template_versions" (
	"template_id" integer NOT NULL,
	"version" integer NOT NULL,
	"name" varchar(80) NOT NULL,
	"extension" varchar(16) NOT NULL,
	"body" text NOT NULL,
	"saved_by" integer NOT NULL,
	"saved_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "export_template_versions_template_id_version_pk" PRIMARY KEY("template_id","version")
);
--> statement-breakpoint
CREATE TABLE "export_templates" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "export_templates_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"name" varchar(80) NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"extension" varchar(16) NOT NULL,
	"body" text NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"created_by" integer NOT NULL,
	"updated_by" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "export_templates_name_unique" UNIQUE("name"),
	CONSTRAINT "export_templates_version_positive" CHECK ("export_templates"."version" >= 1),
	CONSTRAINT "export_templates_extension_format" CHECK ("export_templates"."extension" ~ '^[a-z0-9]{1,16}$')
);
--> statement-breakpoint
ALTER TABLE "export_template_versions" ADD CONSTRAINT "export_template_versions_template_id_export_templates_id_fk" FOREIGN KEY ("template_id") REFERENCES "public"."export_templates"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "export_template_versions" ADD CONSTRAINT "export_template_versions_saved_by_users_id_fk" FOREIGN KEY ("saved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "export_templates" ADD CONSTRAINT "export_templates_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "export_templates" ADD CONSTRAINT "export_templates_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "export_template_versions_saved_idx" ON "export_template_versions" USING btree ("saved_at");