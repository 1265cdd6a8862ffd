CREATE TABLE "storage_reservation" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" text NOT NULL,
	"bytes" bigint NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"object_key" text,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storage_reservation_bytes_positive" CHECK ("storage_reservation"."bytes" > 0),
	CONSTRAINT "storage_reservation_status_known" CHECK ("storage_reservation"."status" in ('pending', 'confirmed', 'released'))
);
--> statement-breakpoint
CREATE TABLE "stored_object" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" text NOT NULL,
	"object_key" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text,
	"media_type" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stored_object_objectKey_unique" UNIQUE("object_key"),
	CONSTRAINT "stored_object_size_nonnegative" CHECK ("stored_object"."size_bytes" >= 0)
);
--> statement-breakpoint
CREATE TABLE "billing_webhook_event" (
	"id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"provider_created_at" bigint NOT NULL,
	"lab_id" text,
	"outcome" text,
	"attempts" integer DEFAULT 1 NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"processed_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "lab_billing" (
	"lab_id" text PRIMARY KEY NOT NULL,
	"plan_id" uuid,
	"provider_customer_id" text,
	"provider_subscription_id" text,
	"subscription_status" text DEFAULT 'none' NOT NULL,
	"current_period_end" timestamp with time zone,
	"cancel_at_period_end" boolean DEFAULT false NOT NULL,
	"provider_event_at" bigint DEFAULT 0 NOT NULL,
	"payment_failed_at" timestamp with time zone,
	"payment_event_at" bigint DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lab_billing_providerCustomerId_unique" UNIQUE("provider_customer_id")
);
--> statement-breakpoint
CREATE TABLE "storage_plan" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"quota_bytes" bigint NOT NULL,
	"monthly_price_minor" integer NOT NULL,
	"currency" text NOT NULL,
	"status" text DEFAULT 'active' NOT NULL,
	"provider_product_id" text,
	"provider_price_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "storage_plan_providerPriceId_unique" UNIQUE("provider_price_id"),
	CONSTRAINT "storage_plan_quota_positive" CHECK ("storage_plan"."quota_bytes" > 0),
	CONSTRAINT "storage_plan_price_nonnegative" CHECK ("storage_plan"."monthly_price_minor" >= 0)
);
--> statement-breakpoint
ALTER TABLE "storage_reservation" ADD CONSTRAINT "storage_reservation_lab_id_organization_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stored_object" ADD CONSTRAINT "stored_object_lab_id_organization_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_billing" ADD CONSTRAINT "lab_billing_lab_id_organization_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_billing" ADD CONSTRAINT "lab_billing_plan_id_storage_plan_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."storage_plan"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "storage_reservation_lab_status_idx" ON "storage_reservation" USING btree ("lab_id","status");--> statement-breakpoint
CREATE INDEX "stored_object_lab_idx" ON "stored_object" USING btree ("lab_id");--> statement-breakpoint
CREATE INDEX "lab_billing_subscription_idx" ON "lab_billing" USING btree ("provider_subscription_id");