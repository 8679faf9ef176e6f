CREATE TABLE "revision_comments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"revision_id" uuid NOT NULL,
	"author_id" uuid,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "revision_comments_body_length" CHECK (char_length("revision_comments"."body") between 1 and 2000)
);
--> statement-breakpoint
ALTER TABLE "revision_comments" ADD CONSTRAINT "revision_comments_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_comments" ADD CONSTRAINT "revision_comments_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_comments" ADD CONSTRAINT "revision_comments_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "revision_comments_revision_time_idx" ON "revision_comments" USING btree ("revision_id","created_at");--> statement-breakpoint
CREATE INDEX "revision_comments_shop_idx" ON "revision_comments" USING btree ("shop_id");