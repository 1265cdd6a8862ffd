CREATE TABLE "release_search" (
	"release_id" text PRIMARY KEY NOT NULL,
	"dataset_id" text NOT NULL,
	"lab_id" text NOT NULL,
	"lab_name" text NOT NULL,
	"listed" boolean DEFAULT false NOT NULL,
	"withdrawn" boolean DEFAULT false NOT NULL,
	"version_count" integer DEFAULT 1 NOT NULL,
	"published_at" timestamp with time zone NOT NULL,
	"title" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"group_type" text,
	"species" text[] DEFAULT '{}'::text[] NOT NULL,
	"setting" text,
	"dimension" integer,
	"individuals" integer,
	"frame_rate" real,
	"licence" text NOT NULL,
	"access_level" text NOT NULL,
	"publication_year" integer NOT NULL,
	"downloads" integer DEFAULT 0 NOT NULL,
	"document" "tsvector" NOT NULL
);
--> statement-breakpoint
ALTER TABLE "release_search" ADD CONSTRAINT "release_search_release_id_release_id_fk" FOREIGN KEY ("release_id") REFERENCES "public"."release"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "release_search_document_idx" ON "release_search" USING gin ("document");--> statement-breakpoint
CREATE INDEX "release_search_species_idx" ON "release_search" USING gin ("species");--> statement-breakpoint
CREATE INDEX "release_search_newest_idx" ON "release_search" USING btree ("listed","published_at" DESC NULLS LAST,"release_id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "release_search_group_size_idx" ON "release_search" USING btree ("listed","individuals" DESC NULLS LAST,"release_id" DESC NULLS LAST);--> statement-breakpoint
CREATE INDEX "release_search_downloads_idx" ON "release_search" USING btree ("listed","downloads" DESC NULLS LAST,"release_id" DESC NULLS LAST);