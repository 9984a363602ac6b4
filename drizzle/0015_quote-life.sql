CREATE TYPE "public"."quote_actor" AS ENUM('customer', 'staff', 'system');--> statement-breakpoint
CREATE TYPE "public"."quote_message_kind" AS ENUM('message', 'change-request', 'decline', 'revision-note', 'withdrawal');--> statement-breakpoint
CREATE TABLE "quote_drafts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"request_id" uuid NOT NULL,
	"body" jsonb NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"updated_by_user_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quote_messages" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"revision" integer NOT NULL,
	"author_user_id" text,
	"side" text NOT NULL,
	"kind" "quote_message_kind" NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "quote_moves" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" text NOT NULL,
	"quote_id" uuid NOT NULL,
	"revision" integer NOT NULL,
	"from_status" "quote_status",
	"to_status" "quote_status" NOT NULL,
	"actor" "quote_actor" NOT NULL,
	"actor_user_id" text,
	"reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "status" SET DATA TYPE text;--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "status" SET DEFAULT 'sent'::text;--> statement-breakpoint
ALTER TABLE "quote_moves" ALTER COLUMN "from_status" SET DATA TYPE text;--> statement-breakpoint
ALTER TABLE "quote_moves" ALTER COLUMN "to_status" SET DATA TYPE text;--> statement-breakpoint
DROP TYPE "public"."quote_status";--> statement-breakpoint
CREATE TYPE "public"."quote_status" AS ENUM('draft', 'sent', 'accepted', 'declined', 'expired', 'superseded', 'withdrawn');--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "status" SET DEFAULT 'sent'::"public"."quote_status";--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "status" SET DATA TYPE "public"."quote_status" USING "status"::"public"."quote_status";--> statement-breakpoint
ALTER TABLE "quote_moves" ALTER COLUMN "from_status" SET DATA TYPE "public"."quote_status" USING "from_status"::"public"."quote_status";--> statement-breakpoint
ALTER TABLE "quote_moves" ALTER COLUMN "to_status" SET DATA TYPE "public"."quote_status" USING "to_status"::"public"."quote_status";--> statement-breakpoint
ALTER TABLE "quote_revisions" ADD COLUMN "sheet" jsonb;--> statement-breakpoint
ALTER TABLE "quote_revisions" ADD COLUMN "design" jsonb;--> statement-breakpoint
ALTER TABLE "quote_revisions" ADD COLUMN "note" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "change_requested_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD COLUMN "request_id" uuid;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD COLUMN "quote_message_id" uuid;--> statement-breakpoint
ALTER TABLE "quote_drafts" ADD CONSTRAINT "quote_drafts_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_drafts" ADD CONSTRAINT "quote_drafts_request_id_bank_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."bank_requests"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_drafts" ADD CONSTRAINT "quote_drafts_updated_by_user_id_users_id_fk" FOREIGN KEY ("updated_by_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_messages" ADD CONSTRAINT "quote_messages_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_messages" ADD CONSTRAINT "quote_messages_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_messages" ADD CONSTRAINT "quote_messages_author_user_id_users_id_fk" FOREIGN KEY ("author_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_moves" ADD CONSTRAINT "quote_moves_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_moves" ADD CONSTRAINT "quote_moves_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quote_moves" ADD CONSTRAINT "quote_moves_actor_user_id_users_id_fk" FOREIGN KEY ("actor_user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "quote_drafts_shop_request_uq" ON "quote_drafts" USING btree ("shop_id","request_id");--> statement-breakpoint
CREATE INDEX "quote_messages_shop_quote_idx" ON "quote_messages" USING btree ("shop_id","quote_id","created_at");--> statement-breakpoint
CREATE INDEX "quote_moves_shop_quote_idx" ON "quote_moves" USING btree ("shop_id","quote_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "quote_moves_shop_quote_accepted_uq" ON "quote_moves" USING btree ("shop_id","quote_id") WHERE "quote_moves"."to_status" = 'accepted';--> statement-breakpoint
CREATE UNIQUE INDEX "quote_moves_shop_quote_rev_to_uq" ON "quote_moves" USING btree ("shop_id","quote_id","revision","to_status");--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_request_id_bank_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."bank_requests"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_quote_message_id_quote_messages_id_fk" FOREIGN KEY ("quote_message_id") REFERENCES "public"."quote_messages"("id") ON DELETE set null ON UPDATE no action;