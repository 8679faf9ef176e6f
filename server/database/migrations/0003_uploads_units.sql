CREATE TYPE "public"."attachment_kind" AS ENUM('image', 'pdf');--> statement-breakpoint
CREATE TYPE "public"."unit_kind" AS ENUM('plate', 'pattern');--> statement-breakpoint
CREATE TYPE "public"."unit_status" AS ENUM('cut', 'laminated', 'hardware_fitted', 'finished', 'in_stock', 'on_loan', 'retired');--> statement-breakpoint
CREATE TABLE "attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"design_id" uuid,
	"unit_id" uuid,
	"kind" "attachment_kind" NOT NULL,
	"content_type" text NOT NULL,
	"name" text NOT NULL,
	"size" bigint NOT NULL,
	"storage_key" text NOT NULL,
	"uploaded_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "attachments_one_owner" CHECK (("attachments"."design_id" is null) <> ("attachments"."unit_id" is null))
);
--> statement-breakpoint
CREATE TABLE "design_references" (
	"design_id" uuid PRIMARY KEY NOT NULL,
	"attachment_id" uuid NOT NULL,
	"x" double precision DEFAULT 0 NOT NULL,
	"y" double precision DEFAULT 0 NOT NULL,
	"rotation" double precision DEFAULT 0 NOT NULL,
	"mm_per_pixel" double precision DEFAULT 1 NOT NULL,
	"opacity" double precision DEFAULT 0.5 NOT NULL,
	"updated_by" uuid,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "design_references_scale_positive" CHECK ("design_references"."mm_per_pixel" > 0),
	CONSTRAINT "design_references_opacity_range" CHECK ("design_references"."opacity" >= 0 and "design_references"."opacity" <= 1)
);
--> statement-breakpoint
CREATE TABLE "unit_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"user_id" uuid,
	"action" text NOT NULL,
	"changes" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "unit_loans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"borrower" text NOT NULL,
	"out_on" date NOT NULL,
	"due_on" date NOT NULL,
	"returned_on" date,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_loans_due_after_out" CHECK ("unit_loans"."due_on" >= "unit_loans"."out_on")
);
--> statement-breakpoint
CREATE TABLE "units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"kind" "unit_kind" NOT NULL,
	"label" text NOT NULL,
	"design_id" uuid,
	"revision_id" uuid,
	"size_label" text,
	"status" "unit_status" DEFAULT 'cut' NOT NULL,
	"location" text DEFAULT '' NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_design_id_designs_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."designs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_references" ADD CONSTRAINT "design_references_design_id_designs_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."designs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_references" ADD CONSTRAINT "design_references_attachment_id_attachments_id_fk" FOREIGN KEY ("attachment_id") REFERENCES "public"."attachments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "design_references" ADD CONSTRAINT "design_references_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_events" ADD CONSTRAINT "unit_events_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_events" ADD CONSTRAINT "unit_events_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_loans" ADD CONSTRAINT "unit_loans_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_loans" ADD CONSTRAINT "unit_loans_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_design_id_designs_id_fk" FOREIGN KEY ("design_id") REFERENCES "public"."designs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "attachments_design_idx" ON "attachments" USING btree ("design_id");--> statement-breakpoint
CREATE INDEX "attachments_unit_idx" ON "attachments" USING btree ("unit_id");--> statement-breakpoint
CREATE INDEX "attachments_shop_idx" ON "attachments" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "design_references_attachment_idx" ON "design_references" USING btree ("attachment_id");--> statement-breakpoint
CREATE INDEX "unit_events_unit_time_idx" ON "unit_events" USING btree ("unit_id","created_at");--> statement-breakpoint
CREATE INDEX "unit_loans_unit_idx" ON "unit_loans" USING btree ("unit_id");--> statement-breakpoint
CREATE UNIQUE INDEX "unit_loans_open_key" ON "unit_loans" USING btree ("unit_id") WHERE "unit_loans"."returned_on" is null;--> statement-breakpoint
CREATE INDEX "units_shop_idx" ON "units" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "units_design_idx" ON "units" USING btree ("design_id");--> statement-breakpoint
CREATE INDEX "units_revision_idx" ON "units" USING btree ("revision_id");--> statement-breakpoint
CREATE UNIQUE INDEX "units_shop_label_key" ON "units" USING btree ("shop_id",lower("label"));