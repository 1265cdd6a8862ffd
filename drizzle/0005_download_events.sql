CREATE TABLE "download_event" (
	"id" text PRIMARY KEY NOT NULL,
	"release_id" text NOT NULL,
	"file_name" text,
	"user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "download_event" ADD CONSTRAINT "download_event_release_id_release_id_fk" FOREIGN KEY ("release_id") REFERENCES "public"."release"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "download_event_release_idx" ON "download_event" USING btree ("release_id");