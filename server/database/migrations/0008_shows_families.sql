ALTER TABLE "designs" ADD COLUMN "quantity" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "designs" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "designs" ADD COLUMN "parent_design_id" uuid;--> statement-breakpoint
ALTER TABLE "designs" ADD COLUMN "parent_revision_id" uuid;--> statement-breakpoint
ALTER TABLE "shows" ADD COLUMN "archived_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "designs" ADD CONSTRAINT "designs_parent_design_id_designs_id_fk" FOREIGN KEY ("parent_design_id") REFERENCES "public"."designs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "designs" ADD CONSTRAINT "designs_parent_revision_id_revisions_id_fk" FOREIGN KEY ("parent_revision_id") REFERENCES "public"."revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "designs_parent_idx" ON "designs" USING btree ("parent_design_id");--> statement-breakpoint
ALTER TABLE "designs" ADD CONSTRAINT "designs_quantity_range" CHECK ("designs"."quantity" between 0 and 999);