CREATE TABLE "sign_in_limits" (
	"key" text PRIMARY KEY NOT NULL,
	"failures" integer DEFAULT 0 NOT NULL,
	"next_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sign_in_limits_failures_nonnegative" CHECK ("sign_in_limits"."failures" >= 0)
);
--> statement-breakpoint
CREATE INDEX "sign_in_limits_updated_idx" ON "sign_in_limits" USING btree ("updated_at");