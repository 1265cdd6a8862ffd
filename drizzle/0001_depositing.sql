CREATE TABLE "dataset" (
	"id" text PRIMARY KEY NOT NULL,
	"lab_id" text NOT NULL,
	"suffix" text NOT NULL,
	"title" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "dataset_suffix_unique" UNIQUE("suffix")
);
--> statement-breakpoint
CREATE TABLE "draft" (
	"id" text PRIMARY KEY NOT NULL,
	"dataset_id" text NOT NULL,
	"state" text DEFAULT 'editing' NOT NULL,
	"metadata" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"base_release_id" text,
	"changelog" text DEFAULT '' NOT NULL,
	"created_by" text NOT NULL,
	"submitted_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "draft_comment" (
	"id" text PRIMARY KEY NOT NULL,
	"draft_id" text NOT NULL,
	"author_id" text NOT NULL,
	"kind" text NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "draft_file" (
	"id" text PRIMARY KEY NOT NULL,
	"draft_id" text NOT NULL,
	"file_name" text NOT NULL,
	"object_key" text NOT NULL,
	"role" text NOT NULL,
	"media_type" text NOT NULL,
	"declared_size" bigint NOT NULL,
	"size_bytes" bigint,
	"sha256" text,
	"state" text DEFAULT 'uploading' NOT NULL,
	"upload_id" text,
	"reservation_id" text,
	"ingest_options" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"result" jsonb,
	"error_message" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "job" (
	"id" text PRIMARY KEY NOT NULL,
	"kind" text NOT NULL,
	"payload" jsonb NOT NULL,
	"state" text DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"max_attempts" integer DEFAULT 3 NOT NULL,
	"run_after" timestamp with time zone DEFAULT now() NOT NULL,
	"locked_by" text,
	"heartbeat_at" timestamp with time zone,
	"progress" real DEFAULT 0 NOT NULL,
	"phase" text DEFAULT 'waiting' NOT NULL,
	"last_error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "release" (
	"id" text PRIMARY KEY NOT NULL,
	"dataset_id" text NOT NULL,
	"version" integer NOT NULL,
	"suffix" text NOT NULL,
	"doi" text NOT NULL,
	"published_at" timestamp with time zone DEFAULT now() NOT NULL,
	"published_by" text NOT NULL,
	"title" text NOT NULL,
	"metadata" jsonb NOT NULL,
	"statistics" jsonb NOT NULL,
	"licence" text NOT NULL,
	"access_level" text NOT NULL,
	"embargo_until" timestamp with time zone,
	"changelog" text DEFAULT '' NOT NULL,
	"bundle_key" text,
	"withdrawn_at" timestamp with time zone,
	"withdrawn_reason" text,
	"withdrawn_by" text,
	CONSTRAINT "release_suffix_unique" UNIQUE("suffix")
);
--> statement-breakpoint
CREATE TABLE "release_file" (
	"id" text PRIMARY KEY NOT NULL,
	"release_id" text NOT NULL,
	"file_name" text NOT NULL,
	"object_key" text NOT NULL,
	"role" text NOT NULL,
	"media_type" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"summary" jsonb
);
--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_lab_id_organization_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organization"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "draft" ADD CONSTRAINT "draft_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "draft" ADD CONSTRAINT "draft_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "draft_comment" ADD CONSTRAINT "draft_comment_draft_id_draft_id_fk" FOREIGN KEY ("draft_id") REFERENCES "public"."draft"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "draft_comment" ADD CONSTRAINT "draft_comment_author_id_user_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "draft_file" ADD CONSTRAINT "draft_file_draft_id_draft_id_fk" FOREIGN KEY ("draft_id") REFERENCES "public"."draft"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "release" ADD CONSTRAINT "release_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "release" ADD CONSTRAINT "release_published_by_user_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."user"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "release_file" ADD CONSTRAINT "release_file_release_id_release_id_fk" FOREIGN KEY ("release_id") REFERENCES "public"."release"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "dataset_lab_idx" ON "dataset" USING btree ("lab_id");--> statement-breakpoint
CREATE UNIQUE INDEX "draft_one_open_per_dataset" ON "draft" USING btree ("dataset_id") WHERE state in ('editing', 'submitted', 'returned');--> statement-breakpoint
CREATE INDEX "draft_file_draft_idx" ON "draft_file" USING btree ("draft_id");--> statement-breakpoint
CREATE UNIQUE INDEX "draft_file_name_per_draft" ON "draft_file" USING btree ("draft_id","file_name");--> statement-breakpoint
CREATE INDEX "job_claim_idx" ON "job" USING btree ("state","run_after");--> statement-breakpoint
CREATE UNIQUE INDEX "release_dataset_version" ON "release" USING btree ("dataset_id","version");--> statement-breakpoint
CREATE INDEX "release_file_release_idx" ON "release_file" USING btree ("release_id");