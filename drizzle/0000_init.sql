CREATE TYPE "public"."member_role" AS ENUM('manager', 'estimator', 'customer');--> statement-breakpoint
CREATE TYPE "public"."cell_shape" AS ENUM('cylinder', 'box');--> statement-breakpoint
CREATE TYPE "public"."component_kind" AS ENUM('balancing-board', 'interconnect', 'terminal', 'enclosure');--> statement-breakpoint
CREATE TYPE "public"."technology" AS ENUM('edlc', 'hybrid', 'electrolytic', 'film');--> statement-breakpoint
CREATE TYPE "public"."price_line_kind" AS ENUM('material', 'labour', 'overhead');--> statement-breakpoint
CREATE TYPE "public"."quote_status" AS ENUM('issued', 'accepted', 'expired', 'withdrawn');--> statement-breakpoint
CREATE TYPE "public"."request_status" AS ENUM('quoted', 'needs-review', 'closed');--> statement-breakpoint
CREATE TYPE "public"."email_status" AS ENUM('waiting', 'sent', 'failed');--> statement-breakpoint
CREATE TABLE "accounts" (
	"id" text PRIMARY KEY NOT NULL,
	"account_id" text NOT NULL,
	"provider_id" text NOT NULL,
	"user_id" text NOT NULL,
	"access_token" text,
	"refresh_token" text,
	"id_token" text,
	"access_token_expires_at" timestamp with time zone,
	"refresh_token_expires_at" timestamp with time zone,
	"scope" text,
	"password" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"email" text NOT NULL,
	"role" "member_role",
	"status" text DEFAULT 'pending' NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"inviter_id" text NOT NULL
);
--> statement-breakpoint
CREATE TABLE "members" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"user_id" text NOT NULL,
	"role" "member_role" DEFAULT 'customer' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sessions" (
	"id" text PRIMARY KEY NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"token" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"ip_address" text,
	"user_agent" text,
	"user_id" text NOT NULL,
	"active_shop_id" text,
	CONSTRAINT "sessions_token_unique" UNIQUE("token")
);
--> statement-breakpoint
CREATE TABLE "shops" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"slug" text NOT NULL,
	"logo" text,
	"metadata" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "shops_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"email" text NOT NULL,
	"email_verified" boolean DEFAULT false NOT NULL,
	"image" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "verifications" (
	"id" text PRIMARY KEY NOT NULL,
	"identifier" text NOT NULL,
	"value" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "catalog_cells" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"sku" text NOT NULL,
	"manufacturer" text NOT NULL,
	"series" text NOT NULL,
	"technology" "technology" NOT NULL,
	"capacitance_f" double precision NOT NULL,
	"tolerance_minus_pct" double precision NOT NULL,
	"tolerance_plus_pct" double precision NOT NULL,
	"rated_voltage_v" double precision NOT NULL,
	"surge_voltage_v" double precision NOT NULL,
	"esr_ohm" double precision NOT NULL,
	"leakage_current_a" double precision NOT NULL,
	"continuous_current_a" double precision NOT NULL,
	"peak_current_a" double precision NOT NULL,
	"mass_kg" double precision NOT NULL,
	"shape" "cell_shape" NOT NULL,
	"diameter_mm" double precision,
	"length_mm" double precision,
	"width_mm" double precision,
	"height_mm" double precision NOT NULL,
	"unit_cost" numeric(14, 4) NOT NULL,
	"stock" integer DEFAULT 0 NOT NULL,
	"lead_time_days" integer DEFAULT 0 NOT NULL,
	"is_active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "catalog_components" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"kind" "component_kind" NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"unit_cost" numeric(14, 4) NOT NULL,
	"specs" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"stock" integer DEFAULT 0 NOT NULL,
	"lead_time_days" integer DEFAULT 0 NOT NULL,
	"is_active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shop_settings" (
	"shop_id" text PRIMARY KEY NOT NULL,
	"currency" text DEFAULT 'EUR' NOT NULL,
	"tagline" text DEFAULT '' NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"design_factors" jsonb NOT NULL,
	"pricing_rules" jsonb NOT NULL,
	"auto_quote_limits" jsonb DEFAULT '{"maxVoltage":1000,"maxStoredEnergy":2000000,"maxCellCount":400}'::jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "bank_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"customer_user_id" text NOT NULL,
	"status" "request_status" NOT NULL,
	"requirement" jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"review_reasons" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"chosen_option" jsonb,
	"idempotency_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quote_lines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"revision_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"code" text NOT NULL,
	"kind" "price_line_kind" NOT NULL,
	"description" text NOT NULL,
	"quantity" numeric(16, 4) NOT NULL,
	"unit" text NOT NULL,
	"unit_price" numeric(16, 4) NOT NULL,
	"amount" numeric(16, 4) NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quote_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"revision" integer NOT NULL,
	"requirement" jsonb NOT NULL,
	"arrangement" jsonb NOT NULL,
	"cell" jsonb NOT NULL,
	"pricing" jsonb NOT NULL,
	"currency" text NOT NULL,
	"quantity" integer NOT NULL,
	"subtotal" numeric(16, 4) NOT NULL,
	"tax" numeric(16, 4) NOT NULL,
	"total" numeric(16, 4) NOT NULL,
	"valid_until" date NOT NULL,
	"created_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quotes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"request_id" uuid NOT NULL,
	"customer_user_id" text NOT NULL,
	"number" text NOT NULL,
	"status" "quote_status" DEFAULT 'issued' NOT NULL,
	"current_revision" integer DEFAULT 1 NOT NULL,
	"idempotency_key" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "request_attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"uploaded_by_user_id" text NOT NULL,
	"request_id" uuid,
	"file_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"sha256" text NOT NULL,
	"storage_key" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "shop_counters" (
	"shop_id" text NOT NULL,
	"kind" text NOT NULL,
	"year" integer NOT NULL,
	"value" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "shop_counters_shop_id_kind_year_pk" PRIMARY KEY("shop_id","kind","year")
);
--> statement-breakpoint
CREATE TABLE "email_outbox" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"kind" text NOT NULL,
	"dedupe_key" text NOT NULL,
	"to_email" text NOT NULL,
	"subject" text NOT NULL,
	"quote_revision_id" uuid,
	"status" "email_status" DEFAULT 'waiting' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"message_id" text,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "accounts" ADD CONSTRAINT "accounts_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_inviter_id_users_id_fk" FOREIGN KEY ("inviter_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "members" ADD CONSTRAINT "members_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "members" ADD CONSTRAINT "members_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sessions" ADD CONSTRAINT "sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catalog_cells" ADD CONSTRAINT "catalog_cells_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catalog_components" ADD CONSTRAINT "catalog_components_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shop_settings" ADD CONSTRAINT "shop_settings_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bank_requests" ADD CONSTRAINT "bank_requests_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bank_requests" ADD CONSTRAINT "bank_requests_customer_user_id_users_id_fk" FOREIGN KEY ("customer_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD CONSTRAINT "quote_lines_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD CONSTRAINT "quote_lines_revision_id_quote_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."quote_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_revisions" ADD CONSTRAINT "quote_revisions_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_revisions" ADD CONSTRAINT "quote_revisions_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_revisions" ADD CONSTRAINT "quote_revisions_created_by_user_id_users_id_fk" FOREIGN KEY ("created_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_request_id_bank_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."bank_requests"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_customer_user_id_users_id_fk" FOREIGN KEY ("customer_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "request_attachments" ADD CONSTRAINT "request_attachments_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "request_attachments" ADD CONSTRAINT "request_attachments_uploaded_by_user_id_users_id_fk" FOREIGN KEY ("uploaded_by_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "request_attachments" ADD CONSTRAINT "request_attachments_request_id_bank_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."bank_requests"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "shop_counters" ADD CONSTRAINT "shop_counters_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_quote_revision_id_quote_revisions_id_fk" FOREIGN KEY ("quote_revision_id") REFERENCES "public"."quote_revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "accounts_user_idx" ON "accounts" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "invitations_shop_email_idx" ON "invitations" USING btree ("shop_id","email");--> statement-breakpoint
CREATE UNIQUE INDEX "members_shop_user_uq" ON "members" USING btree ("shop_id","user_id");--> statement-breakpoint
CREATE INDEX "members_shop_role_idx" ON "members" USING btree ("shop_id","role");--> statement-breakpoint
CREATE INDEX "sessions_user_idx" ON "sessions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "verifications_identifier_idx" ON "verifications" USING btree ("identifier");--> statement-breakpoint
CREATE UNIQUE INDEX "catalog_cells_shop_sku_uq" ON "catalog_cells" USING btree ("shop_id","sku");--> statement-breakpoint
CREATE INDEX "catalog_cells_shop_active_idx" ON "catalog_cells" USING btree ("shop_id","is_active","technology");--> statement-breakpoint
CREATE UNIQUE INDEX "catalog_components_shop_sku_uq" ON "catalog_components" USING btree ("shop_id","sku");--> statement-breakpoint
CREATE INDEX "catalog_components_shop_kind_idx" ON "catalog_components" USING btree ("shop_id","kind");--> statement-breakpoint
CREATE INDEX "bank_requests_shop_status_idx" ON "bank_requests" USING btree ("shop_id","status","created_at");--> statement-breakpoint
CREATE INDEX "bank_requests_shop_customer_idx" ON "bank_requests" USING btree ("shop_id","customer_user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "bank_requests_shop_idempotency_uq" ON "bank_requests" USING btree ("shop_id","idempotency_key");--> statement-breakpoint
CREATE UNIQUE INDEX "quote_lines_shop_revision_pos_uq" ON "quote_lines" USING btree ("shop_id","revision_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "quote_revisions_shop_quote_rev_uq" ON "quote_revisions" USING btree ("shop_id","quote_id","revision");--> statement-breakpoint
CREATE UNIQUE INDEX "quotes_shop_number_uq" ON "quotes" USING btree ("shop_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "quotes_shop_idempotency_uq" ON "quotes" USING btree ("shop_id","idempotency_key");--> statement-breakpoint
CREATE INDEX "quotes_shop_customer_idx" ON "quotes" USING btree ("shop_id","customer_user_id","created_at");--> statement-breakpoint
CREATE INDEX "quotes_shop_created_idx" ON "quotes" USING btree ("shop_id","created_at");--> statement-breakpoint
CREATE INDEX "request_attachments_shop_request_idx" ON "request_attachments" USING btree ("shop_id","request_id");--> statement-breakpoint
CREATE INDEX "request_attachments_shop_uploader_idx" ON "request_attachments" USING btree ("shop_id","uploaded_by_user_id");--> statement-breakpoint
CREATE UNIQUE INDEX "email_outbox_shop_dedupe_uq" ON "email_outbox" USING btree ("shop_id","dedupe_key");--> statement-breakpoint
CREATE INDEX "email_outbox_shop_status_idx" ON "email_outbox" USING btree ("shop_id","status","created_at");