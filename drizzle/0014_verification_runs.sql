CREATE TABLE "verification_runs" (
	"id" integer PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "verification_runs_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1),
	"release_id" integer NOT NULL,
	"vector_set" varchar(40) NOT NULL,
	"verdict" text NOT NULL,
	"compared" integer NOT NULL,
	"mismatches" integer NOT NULL,
	"latency_samples" integer NOT NULL,
	"latency_source" text NOT NULL,
	"result" jsonb NOT NULL,
	"output_bits" integer NOT NULL,
	"format" text NOT NULL,
	"file_name" varchar(255) NOT NULL,
	"upload" "bytea" NOT NULL,
	"upload_sha256" text NOT NULL,
	"upload_size" integer NOT NULL,
	"simulator" varchar(120),
	"rtl_revision" varchar(120),
	"release_withdrawn" boolean NOT NULL,
	"uploaded_by" integer NOT NULL,
	"token_id" integer,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "verification_runs_verdict_check" CHECK ("verification_runs"."verdict" in ('pass', 'fail')),
	CONSTRAINT "verification_runs_sha256_format" CHECK ("verification_runs"."upload_sha256" ~ '^[0-9a-f]{64}$'),
	CONSTRAINT "verification_runs_verdict_consistent" CHECK (("verification_runs"."verdict" = 'pass') = ("verification_runs"."mismatches" = 0))
);
--> statement-breakpoint
ALTER TABLE "api_tokens" DROP CONSTRAINT "api_tokens_scope_check";--> statement-breakpoint
ALTER TABLE "verification_runs" ADD CONSTRAINT "verification_runs_release_id_releases_id_fk" FOREIGN KEY ("release_id") REFERENCES "public"."releases"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "verification_runs" ADD CONSTRAINT "verification_runs_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "verification_runs_release_idx" ON "verification_runs" USING btree ("release_id","id");--> statement-breakpoint
ALTER TABLE "api_tokens" ADD CONSTRAINT "api_tokens_scope_check" CHECK ("api_tokens"."scope" in ('read', 'read-write', 'verify'));