CREATE TYPE "public"."task_state" AS ENUM('queued', 'done', 'failed', 'dropped');--> statement-breakpoint
CREATE TABLE "stripe_charge" (
	"organization_id" text NOT NULL,
	"id" text NOT NULL,
	"payment_intent_id" text,
	"status" text NOT NULL,
	"currency" text NOT NULL,
	"amount_cents" integer NOT NULL,
	"fee_cents" integer,
	"payment_id" text,
	"job_id" text,
	"stripe_created" timestamp with time zone NOT NULL,
	"synced_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stripe_charge_organization_id_id_pk" PRIMARY KEY("organization_id","id")
);
--> statement-breakpoint
ALTER TABLE "stripe_charge" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "stripe_payout" (
	"organization_id" text NOT NULL,
	"id" text NOT NULL,
	"status" text NOT NULL,
	"currency" text NOT NULL,
	"amount_cents" integer NOT NULL,
	"gross_cents" integer DEFAULT 0 NOT NULL,
	"fee_cents" integer DEFAULT 0 NOT NULL,
	"refund_cents" integer DEFAULT 0 NOT NULL,
	"transactions" integer DEFAULT 0 NOT NULL,
	"arrival_date" timestamp with time zone NOT NULL,
	"stripe_created" timestamp with time zone NOT NULL,
	"synced_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stripe_payout_organization_id_id_pk" PRIMARY KEY("organization_id","id")
);
--> statement-breakpoint
ALTER TABLE "stripe_payout" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "stripe_refund" (
	"organization_id" text NOT NULL,
	"id" text NOT NULL,
	"charge_id" text,
	"payment_intent_id" text,
	"status" text NOT NULL,
	"currency" text NOT NULL,
	"amount_cents" integer NOT NULL,
	"stripe_created" timestamp with time zone NOT NULL,
	"synced_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "stripe_refund_organization_id_id_pk" PRIMARY KEY("organization_id","id")
);
--> statement-breakpoint
ALTER TABLE "stripe_refund" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "stripe_sync" (
	"organization_id" text PRIMARY KEY NOT NULL,
	"synced_until" timestamp with time zone,
	"last_run_at" timestamp with time zone,
	"last_error" text,
	"last_error_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "stripe_sync" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "task" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"kind" text NOT NULL,
	"payload" jsonb NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"job_id" text,
	"state" "task_state" DEFAULT 'queued' NOT NULL,
	"round" integer DEFAULT 0 NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"created_by" text,
	"finished_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "task" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "stripe_charge" ADD CONSTRAINT "stripe_charge_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stripe_payout" ADD CONSTRAINT "stripe_payout_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stripe_refund" ADD CONSTRAINT "stripe_refund_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stripe_sync" ADD CONSTRAINT "stripe_sync_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "task" ADD CONSTRAINT "task_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "task" ADD CONSTRAINT "task_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "task" ADD CONSTRAINT "task_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "stripe_charge_created_idx" ON "stripe_charge" USING btree ("organization_id","stripe_created");--> statement-breakpoint
CREATE INDEX "stripe_payout_created_idx" ON "stripe_payout" USING btree ("organization_id","stripe_created");--> statement-breakpoint
CREATE INDEX "stripe_refund_created_idx" ON "stripe_refund" USING btree ("organization_id","stripe_created");--> statement-breakpoint
CREATE INDEX "task_organization_state_idx" ON "task" USING btree ("organization_id","state","created_at");--> statement-breakpoint
CREATE POLICY "stripe_account_lookup" ON "store_settings" AS PERMISSIVE FOR SELECT TO public USING (stripe_account_id = current_setting('app.stripe_account', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "stripe_charge" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "stripe_payout" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "stripe_refund" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "stripe_sync" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "task" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));