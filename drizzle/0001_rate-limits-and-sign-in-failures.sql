CREATE TABLE "rate_limits" (
	"key" text PRIMARY KEY NOT NULL,
	"count" integer NOT NULL,
	"window_ends_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_in_failures" (
	"account_key" text PRIMARY KEY NOT NULL,
	"failures" integer NOT NULL,
	"last_failure_at" timestamp with time zone NOT NULL,
	"locked_until" timestamp with time zone
);
--> statement-breakpoint
CREATE INDEX "rate_limits_window_ends_idx" ON "rate_limits" USING btree ("window_ends_at");--> statement-breakpoint
CREATE INDEX "sign_in_failures_last_failure_idx" ON "sign_in_failures" USING btree ("last_failure_at");