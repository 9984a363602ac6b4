CREATE TYPE "public"."order_status" AS ENUM('paid', 'kitting', 'assembling', 'testing', 'ready', 'shipped', 'delivered', 'on-hold', 'cancelled', 'refunded');--> statement-breakpoint
CREATE TYPE "public"."payment_kind" AS ENUM('full', 'deposit', 'balance');--> statement-breakpoint
CREATE TYPE "public"."payment_status" AS ENUM('open', 'paid', 'expired');--> statement-breakpoint
CREATE TABLE "order_status_history" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"order_id" uuid NOT NULL,
	"from_status" "order_status",
	"to_status" "order_status" NOT NULL,
	"actor_user_id" text,
	"note" text DEFAULT '' NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "order_test_records" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"order_id" uuid NOT NULL,
	"bank" integer NOT NULL,
	"measured" jsonb NOT NULL,
	"limits" jsonb NOT NULL,
	"checks" jsonb NOT NULL,
	"is_passed" boolean NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"tested_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "orders" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"number" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"quote_revision_id" uuid NOT NULL,
	"customer_user_id" text NOT NULL,
	"status" "order_status" NOT NULL,
	"held_from" "order_status",
	"currency" text NOT NULL,
	"total" numeric(16, 4) NOT NULL,
	"amount_paid" numeric(16, 4) DEFAULT '0' NOT NULL,
	"amount_refunded" numeric(16, 4) DEFAULT '0' NOT NULL,
	"quantity" integer NOT NULL,
	"due_date" date NOT NULL,
	"carrier" text,
	"tracking_reference" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "payment_refunds" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"payment_id" uuid NOT NULL,
	"stripe_refund_id" text NOT NULL,
	"amount" numeric(16, 4) NOT NULL,
	"currency" text NOT NULL,
	"status" text NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"requested_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"quote_revision_id" uuid NOT NULL,
	"customer_user_id" text NOT NULL,
	"kind" "payment_kind" NOT NULL,
	"status" "payment_status" DEFAULT 'open' NOT NULL,
	"amount" numeric(16, 4) NOT NULL,
	"currency" text NOT NULL,
	"stripe_session_id" text NOT NULL,
	"checkout_url" text,
	"expires_at" timestamp with time zone,
	"stripe_payment_intent_id" text,
	"amount_received" numeric(16, 4),
	"paid_at" timestamp with time zone,
	"charge_refunded" numeric(16, 4) DEFAULT '0' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "stripe_events" (
	"id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"object_id" text,
	"source" text NOT NULL,
	"outcome" text NOT NULL,
	"stripe_created_at" timestamp with time zone NOT NULL,
	"handled_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "email_outbox" ADD COLUMN "order_id" uuid;--> statement-breakpoint
ALTER TABLE "order_status_history" ADD CONSTRAINT "order_status_history_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "order_status_history" ADD CONSTRAINT "order_status_history_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "order_status_history" ADD CONSTRAINT "order_status_history_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "order_test_records" ADD CONSTRAINT "order_test_records_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "order_test_records" ADD CONSTRAINT "order_test_records_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "order_test_records" ADD CONSTRAINT "order_test_records_tested_by_user_id_users_id_fk" FOREIGN KEY ("tested_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "orders" ADD CONSTRAINT "orders_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "orders" ADD CONSTRAINT "orders_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "orders" ADD CONSTRAINT "orders_quote_revision_id_quote_revisions_id_fk" FOREIGN KEY ("quote_revision_id") REFERENCES "public"."quote_revisions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "orders" ADD CONSTRAINT "orders_customer_user_id_users_id_fk" FOREIGN KEY ("customer_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_refunds" ADD CONSTRAINT "payment_refunds_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_refunds" ADD CONSTRAINT "payment_refunds_payment_id_payments_id_fk" FOREIGN KEY ("payment_id") REFERENCES "public"."payments"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_refunds" ADD CONSTRAINT "payment_refunds_requested_by_user_id_users_id_fk" FOREIGN KEY ("requested_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_quote_revision_id_quote_revisions_id_fk" FOREIGN KEY ("quote_revision_id") REFERENCES "public"."quote_revisions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_customer_user_id_users_id_fk" FOREIGN KEY ("customer_user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "order_status_history_shop_order_idx" ON "order_status_history" USING btree ("shop_id","order_id","at");--> statement-breakpoint
CREATE INDEX "order_test_records_shop_order_idx" ON "order_test_records" USING btree ("shop_id","order_id","bank","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "orders_shop_number_uq" ON "orders" USING btree ("shop_id","number");--> statement-breakpoint
CREATE UNIQUE INDEX "orders_shop_quote_uq" ON "orders" USING btree ("shop_id","quote_id");--> statement-breakpoint
CREATE INDEX "orders_shop_status_due_idx" ON "orders" USING btree ("shop_id","status","due_date");--> statement-breakpoint
CREATE INDEX "orders_shop_customer_idx" ON "orders" USING btree ("shop_id","customer_user_id","created_at");--> statement-breakpoint
CREATE INDEX "orders_shop_created_idx" ON "orders" USING btree ("shop_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "payment_refunds_shop_refund_uq" ON "payment_refunds" USING btree ("shop_id","stripe_refund_id");--> statement-breakpoint
CREATE INDEX "payment_refunds_shop_payment_idx" ON "payment_refunds" USING btree ("shop_id","payment_id");--> statement-breakpoint
CREATE UNIQUE INDEX "payments_shop_session_uq" ON "payments" USING btree ("shop_id","stripe_session_id");--> statement-breakpoint
CREATE UNIQUE INDEX "payments_shop_quote_open_uq" ON "payments" USING btree ("shop_id","quote_id") WHERE "payments"."status" = 'open';--> statement-breakpoint
CREATE INDEX "payments_shop_quote_idx" ON "payments" USING btree ("shop_id","quote_id","created_at");--> statement-breakpoint
CREATE INDEX "payments_shop_paid_idx" ON "payments" USING btree ("shop_id","paid_at");--> statement-breakpoint
CREATE INDEX "stripe_events_handled_idx" ON "stripe_events" USING btree ("handled_at");--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE set null ON UPDATE no action;