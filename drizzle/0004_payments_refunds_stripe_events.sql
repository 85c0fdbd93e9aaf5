CREATE TYPE "public"."payment_method" AS ENUM('card', 'cash', 'cheque', 'card_terminal', 'bank_transfer');--> statement-breakpoint
CREATE TYPE "public"."payment_purpose" AS ENUM('deposit', 'balance', 'change_order');--> statement-breakpoint
CREATE TYPE "public"."payment_status" AS ENUM('pending', 'succeeded', 'failed', 'refunded');--> statement-breakpoint
CREATE TYPE "public"."refund_reason" AS ENUM('cancellation', 'overcharge', 'other');--> statement-breakpoint
CREATE TYPE "public"."refund_status" AS ENUM('pending', 'succeeded', 'failed');--> statement-breakpoint
CREATE TABLE "payment" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"job_id" text NOT NULL,
	"quote_id" text,
	"purpose" "payment_purpose" NOT NULL,
	"method" "payment_method" NOT NULL,
	"status" "payment_status" DEFAULT 'pending' NOT NULL,
	"currency" text NOT NULL,
	"amount_cents" integer NOT NULL,
	"refunded_cents" integer DEFAULT 0 NOT NULL,
	"fee_cents" integer,
	"reference" text DEFAULT '' NOT NULL,
	"failure_message" text,
	"stripe_checkout_session_id" text,
	"stripe_payment_intent_id" text,
	"stripe_charge_id" text,
	"stripe_balance_transaction_id" text,
	"checkout_url" text,
	"checkout_expires_at" timestamp with time zone,
	"recorded_by" text,
	"succeeded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payment_stripe_checkout_session_id_unique" UNIQUE("stripe_checkout_session_id"),
	CONSTRAINT "payment_stripe_payment_intent_id_unique" UNIQUE("stripe_payment_intent_id"),
	CONSTRAINT "payment_stripe_charge_id_unique" UNIQUE("stripe_charge_id"),
	CONSTRAINT "payment_id_organization_uq" UNIQUE("id","organization_id"),
	CONSTRAINT "payment_amount_positive" CHECK ("payment"."amount_cents" > 0),
	CONSTRAINT "payment_refund_within" CHECK ("payment"."refunded_cents" >= 0 and "payment"."refunded_cents" <= "payment"."amount_cents")
);
--> statement-breakpoint
ALTER TABLE "payment" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "refund" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"payment_id" text NOT NULL,
	"amount_cents" integer NOT NULL,
	"reason" "refund_reason" NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"status" "refund_status" DEFAULT 'pending' NOT NULL,
	"stripe_refund_id" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "refund_stripe_refund_id_unique" UNIQUE("stripe_refund_id"),
	CONSTRAINT "refund_amount_positive" CHECK ("refund"."amount_cents" > 0)
);
--> statement-breakpoint
ALTER TABLE "refund" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "stripe_event" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"type" text NOT NULL,
	"object_id" text,
	"stripe_created" timestamp with time zone NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"outcome" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
ALTER TABLE "stripe_event" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "store_settings" ADD COLUMN "stripe_account_id" text;--> statement-breakpoint
ALTER TABLE "payment" ADD CONSTRAINT "payment_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment" ADD CONSTRAINT "payment_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment" ADD CONSTRAINT "payment_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment" ADD CONSTRAINT "payment_quote_same_store_fk" FOREIGN KEY ("quote_id","organization_id") REFERENCES "public"."quote"("id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refund" ADD CONSTRAINT "refund_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refund" ADD CONSTRAINT "refund_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "refund" ADD CONSTRAINT "refund_payment_same_store_fk" FOREIGN KEY ("payment_id","organization_id") REFERENCES "public"."payment"("id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stripe_event" ADD CONSTRAINT "stripe_event_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "payment_job_idx" ON "payment" USING btree ("organization_id","job_id");--> statement-breakpoint
CREATE INDEX "payment_created_idx" ON "payment" USING btree ("organization_id","created_at");--> statement-breakpoint
CREATE INDEX "refund_payment_idx" ON "refund" USING btree ("organization_id","payment_id");--> statement-breakpoint
CREATE INDEX "stripe_event_organization_idx" ON "stripe_event" USING btree ("organization_id","received_at");--> statement-breakpoint
ALTER TABLE "store_settings" ADD CONSTRAINT "store_settings_stripe_account_id_unique" UNIQUE("stripe_account_id");--> statement-breakpoint
CREATE POLICY "store_isolation" ON "payment" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "refund" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "stripe_event" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));