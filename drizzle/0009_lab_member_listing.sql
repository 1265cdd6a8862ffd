CREATE TABLE "lab_member_listing" (
	"lab_id" text NOT NULL,
	"user_id" text NOT NULL,
	"listed" boolean DEFAULT false NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lab_member_listing_lab_id_user_id_pk" PRIMARY KEY("lab_id","user_id")
);
--> statement-breakpoint
ALTER TABLE "lab_member_listing" ADD CONSTRAINT "lab_member_listing_lab_id_organization_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_member_listing" ADD CONSTRAINT "lab_member_listing_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;