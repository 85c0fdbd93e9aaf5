CREATE TYPE "public"."change_order_status" AS ENUM('submitted', 'reviewed', 'approved', 'declined');--> statement-breakpoint
CREATE TYPE "public"."field_item_kind" AS ENUM('found', 'reading', 'note');--> statement-breakpoint
CREATE TYPE "public"."photo_purpose" AS ENUM('report', 'completion');--> statement-breakpoint
CREATE TYPE "public"."reading_kind" AS ENUM('flatness', 'rh', 'calcium_chloride', 'wood_mc_subfloor', 'wood_mc_flooring');--> statement-breakpoint
CREATE TYPE "public"."statement_line_kind" AS ENUM('install', 'extra', 'chargeback', 'adjustment');--> statement-breakpoint
CREATE TYPE "public"."statement_status" AS ENUM('open', 'paid');--> statement-breakpoint
CREATE TABLE "booking" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"job_id" text NOT NULL,
	"installer_id" text NOT NULL,
	"starts_on" date NOT NULL,
	"days" integer NOT NULL,
	"ends_on" date GENERATED ALWAYS AS (starts_on + days - 1) STORED,
	"arrives_at" time,
	"proposed_days" integer NOT NULL,
	"proposal" jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"booked_by" text,
	"cancelled_at" timestamp with time zone,
	"cancelled_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "booking_id_organization_uq" UNIQUE("id","organization_id"),
	CONSTRAINT "booking_days" CHECK ("booking"."days" between 1 and 60),
	CONSTRAINT "booking_proposed_days" CHECK ("booking"."proposed_days" between 0 and 366),
	CONSTRAINT "booking_version" CHECK ("booking"."version" >= 1)
);
--> statement-breakpoint
ALTER TABLE "booking" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "change_order" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"job_id" text NOT NULL,
	"report_id" text NOT NULL,
	"number" integer NOT NULL,
	"status" "change_order_status" DEFAULT 'submitted' NOT NULL,
	"input" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"adjustments" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"currency" text NOT NULL,
	"subtotal_cents" integer NOT NULL,
	"tax_cents" integer NOT NULL,
	"total_cents" integer NOT NULL,
	"pay_delta_cents" integer NOT NULL,
	"created_by" text,
	"reviewed_at" timestamp with time zone,
	"reviewed_by" text,
	"sent_at" timestamp with time zone,
	"sent_to" text,
	"decline_reason" text DEFAULT '' NOT NULL,
	"declined_by" text,
	"decided_at" timestamp with time zone,
	"decided_name" text,
	"decided_ip" text,
	"decided_user_agent" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "change_order_id_organization_uq" UNIQUE("id","organization_id"),
	CONSTRAINT "change_order_id_job_organization_uq" UNIQUE("id","job_id","organization_id"),
	CONSTRAINT "change_order_job_number_uq" UNIQUE("organization_id","job_id","number"),
	CONSTRAINT "change_order_number" CHECK ("change_order"."number" >= 1),
	CONSTRAINT "change_order_total" CHECK ("change_order"."total_cents" = "change_order"."subtotal_cents" + "change_order"."tax_cents"),
	CONSTRAINT "change_order_approved_by_customer" CHECK ("change_order"."status" <> 'approved' or ("change_order"."decided_at" is not null and "change_order"."decided_name" <> '')),
	CONSTRAINT "change_order_manager_decline_reason" CHECK ("change_order"."declined_by" is null or "change_order"."decline_reason" <> '')
);
--> statement-breakpoint
ALTER TABLE "change_order" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "field_item" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"report_id" text NOT NULL,
	"client_id" text NOT NULL,
	"kind" "field_item_kind" NOT NULL,
	"room_id" text,
	"ref" jsonb,
	"ref_key" text,
	"qty" numeric(14, 4),
	"unit" text,
	"reading_kind" "reading_kind",
	"reading" jsonb,
	"note" text DEFAULT '' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"recorded_by" text,
	"recorded_at" timestamp with time zone NOT NULL,
	"deleted_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "field_item_client_uq" UNIQUE("organization_id","client_id"),
	CONSTRAINT "field_item_id_organization_uq" UNIQUE("id","organization_id"),
	CONSTRAINT "field_item_client_id" CHECK (char_length("field_item"."client_id") between 8 and 64),
	CONSTRAINT "field_item_found_shape" CHECK ("field_item"."kind" <> 'found' or ("field_item"."ref" is not null and "field_item"."ref_key" is not null and "field_item"."unit" is not null and "field_item"."qty" is not null and "field_item"."qty" >= 0 and "field_item"."qty" <= 1000000)),
	CONSTRAINT "field_item_reading_shape" CHECK ("field_item"."kind" <> 'reading' or ("field_item"."reading_kind" is not null and "field_item"."reading" is not null)),
	CONSTRAINT "field_item_note_shape" CHECK ("field_item"."kind" <> 'note' or "field_item"."note" <> ''),
	CONSTRAINT "field_item_version" CHECK ("field_item"."version" >= 1)
);
--> statement-breakpoint
ALTER TABLE "field_item" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "field_photo" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"job_id" text NOT NULL,
	"client_id" text NOT NULL,
	"purpose" "photo_purpose" NOT NULL,
	"room_id" text,
	"item_client_id" text,
	"file_key" text NOT NULL,
	"thumb_key" text NOT NULL,
	"media_type" text NOT NULL,
	"byte_size" integer NOT NULL,
	"width" integer NOT NULL,
	"height" integer NOT NULL,
	"caption" text DEFAULT '' NOT NULL,
	"taken_at" timestamp with time zone,
	"uploaded_by" text,
	"deleted_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "field_photo_client_uq" UNIQUE("organization_id","client_id"),
	CONSTRAINT "field_photo_id_organization_uq" UNIQUE("id","organization_id"),
	CONSTRAINT "field_photo_client_id" CHECK (char_length("field_photo"."client_id") between 8 and 64),
	CONSTRAINT "field_photo_media_type" CHECK ("field_photo"."media_type" in ('image/jpeg', 'image/png', 'image/webp')),
	CONSTRAINT "field_photo_byte_size" CHECK ("field_photo"."byte_size" between 1 and 20971520),
	CONSTRAINT "field_photo_dimensions" CHECK ("field_photo"."width" between 1 and 20000 and "field_photo"."height" between 1 and 20000),
	CONSTRAINT "field_photo_completion_no_item" CHECK ("field_photo"."purpose" <> 'completion' or "field_photo"."item_client_id" is null)
);
--> statement-breakpoint
ALTER TABLE "field_photo" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "field_report" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"job_id" text NOT NULL,
	"checked_in_at" timestamp with time zone NOT NULL,
	"checked_in_by" text,
	"submitted_at" timestamp with time zone,
	"submitted_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "field_report_job_uq" UNIQUE("organization_id","job_id"),
	CONSTRAINT "field_report_id_organization_uq" UNIQUE("id","organization_id")
);
--> statement-breakpoint
ALTER TABLE "field_report" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "installer_profile" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"user_id" text NOT NULL,
	"crew_size" integer DEFAULT 1 NOT NULL,
	"floor_kinds" text[] DEFAULT '{}'::text[] NOT NULL,
	"sq_ft_per_day" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"pay_rates" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"days_off" integer[] DEFAULT '{}'::integer[] NOT NULL,
	"phone" text DEFAULT '' NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "installer_profile_user_uq" UNIQUE("organization_id","user_id"),
	CONSTRAINT "installer_profile_crew_size" CHECK ("installer_profile"."crew_size" between 1 and 50),
	CONSTRAINT "installer_profile_days_off" CHECK ("installer_profile"."days_off" <@ array[1, 2, 3, 4, 5, 6, 7])
);
--> statement-breakpoint
ALTER TABLE "installer_profile" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "installer_statement" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"installer_id" text NOT NULL,
	"period_start" date NOT NULL,
	"period_end" date NOT NULL,
	"currency" text NOT NULL,
	"status" "statement_status" DEFAULT 'open' NOT NULL,
	"total_cents" integer DEFAULT 0 NOT NULL,
	"paid_at" timestamp with time zone,
	"paid_by" text,
	"paid_reference" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "installer_statement_period_uq" UNIQUE("organization_id","installer_id","period_start"),
	CONSTRAINT "installer_statement_id_installer_organization_uq" UNIQUE("id","installer_id","organization_id"),
	CONSTRAINT "installer_statement_period" CHECK ("installer_statement"."period_end" >= "installer_statement"."period_start" and "installer_statement"."period_end" - "installer_statement"."period_start" < 366),
	CONSTRAINT "installer_statement_paid" CHECK (("installer_statement"."status" = 'open' and "installer_statement"."paid_at" is null) or ("installer_statement"."status" = 'paid' and "installer_statement"."paid_at" is not null and "installer_statement"."paid_reference" <> ''))
);
--> statement-breakpoint
ALTER TABLE "installer_statement" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "installer_statement_line" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"statement_id" text NOT NULL,
	"installer_id" text NOT NULL,
	"kind" "statement_line_kind" NOT NULL,
	"job_id" text,
	"change_order_id" text,
	"description" text DEFAULT '' NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"amount_cents" integer NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "installer_statement_line_amount" CHECK ("installer_statement_line"."amount_cents" between -100000000 and 100000000),
	CONSTRAINT "installer_statement_line_install" CHECK ("installer_statement_line"."kind" <> 'install' or ("installer_statement_line"."job_id" is not null and "installer_statement_line"."amount_cents" >= 0)),
	CONSTRAINT "installer_statement_line_extra" CHECK ("installer_statement_line"."kind" <> 'extra' or ("installer_statement_line"."job_id" is not null and "installer_statement_line"."change_order_id" is not null)),
	CONSTRAINT "installer_statement_line_chargeback" CHECK ("installer_statement_line"."kind" <> 'chargeback' or ("installer_statement_line"."amount_cents" < 0 and "installer_statement_line"."reason" <> '')),
	CONSTRAINT "installer_statement_line_adjustment" CHECK ("installer_statement_line"."kind" <> 'adjustment' or "installer_statement_line"."reason" <> '')
);
--> statement-breakpoint
ALTER TABLE "installer_statement_line" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "installer_time_off" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"installer_id" text NOT NULL,
	"starts_on" date NOT NULL,
	"ends_on" date NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "installer_time_off_dates" CHECK ("installer_time_off"."ends_on" >= "installer_time_off"."starts_on" and "installer_time_off"."ends_on" - "installer_time_off"."starts_on" < 366)
);
--> statement-breakpoint
ALTER TABLE "installer_time_off" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE TABLE "job_completion" (
	"id" text PRIMARY KEY NOT NULL,
	"organization_id" text NOT NULL,
	"job_id" text NOT NULL,
	"completed_at" timestamp with time zone NOT NULL,
	"completed_by" text,
	"walkthrough_notes" text DEFAULT '' NOT NULL,
	"signed_at" timestamp with time zone,
	"signed_name" text,
	"signed_ip" text,
	"signed_user_agent" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "job_completion_job_uq" UNIQUE("organization_id","job_id"),
	CONSTRAINT "job_completion_signed" CHECK (("job_completion"."signed_at" is null and "job_completion"."signed_name" is null) or ("job_completion"."signed_at" is not null and "job_completion"."signed_name" <> ''))
);
--> statement-breakpoint
ALTER TABLE "job_completion" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "payment" ADD COLUMN "change_order_id" text;--> statement-breakpoint
ALTER TABLE "booking" ADD CONSTRAINT "booking_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "booking" ADD CONSTRAINT "booking_booked_by_user_id_fk" FOREIGN KEY ("booked_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "booking" ADD CONSTRAINT "booking_cancelled_by_user_id_fk" FOREIGN KEY ("cancelled_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "booking" ADD CONSTRAINT "booking_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "booking" ADD CONSTRAINT "booking_installer_profile_fk" FOREIGN KEY ("organization_id","installer_id") REFERENCES "public"."installer_profile"("organization_id","user_id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_order" ADD CONSTRAINT "change_order_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_order" ADD CONSTRAINT "change_order_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_order" ADD CONSTRAINT "change_order_reviewed_by_user_id_fk" FOREIGN KEY ("reviewed_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_order" ADD CONSTRAINT "change_order_declined_by_user_id_fk" FOREIGN KEY ("declined_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_order" ADD CONSTRAINT "change_order_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "change_order" ADD CONSTRAINT "change_order_report_same_store_fk" FOREIGN KEY ("report_id","organization_id") REFERENCES "public"."field_report"("id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_item" ADD CONSTRAINT "field_item_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_item" ADD CONSTRAINT "field_item_recorded_by_user_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_item" ADD CONSTRAINT "field_item_report_same_store_fk" FOREIGN KEY ("report_id","organization_id") REFERENCES "public"."field_report"("id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_photo" ADD CONSTRAINT "field_photo_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_photo" ADD CONSTRAINT "field_photo_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_photo" ADD CONSTRAINT "field_photo_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_photo" ADD CONSTRAINT "field_photo_item_same_store_fk" FOREIGN KEY ("organization_id","item_client_id") REFERENCES "public"."field_item"("organization_id","client_id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_report" ADD CONSTRAINT "field_report_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_report" ADD CONSTRAINT "field_report_checked_in_by_user_id_fk" FOREIGN KEY ("checked_in_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_report" ADD CONSTRAINT "field_report_submitted_by_user_id_fk" FOREIGN KEY ("submitted_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "field_report" ADD CONSTRAINT "field_report_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_profile" ADD CONSTRAINT "installer_profile_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_profile" ADD CONSTRAINT "installer_profile_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement" ADD CONSTRAINT "installer_statement_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement" ADD CONSTRAINT "installer_statement_paid_by_user_id_fk" FOREIGN KEY ("paid_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement" ADD CONSTRAINT "installer_statement_profile_fk" FOREIGN KEY ("organization_id","installer_id") REFERENCES "public"."installer_profile"("organization_id","user_id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement_line" ADD CONSTRAINT "installer_statement_line_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement_line" ADD CONSTRAINT "installer_statement_line_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement_line" ADD CONSTRAINT "installer_statement_line_statement_fk" FOREIGN KEY ("statement_id","installer_id","organization_id") REFERENCES "public"."installer_statement"("id","installer_id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement_line" ADD CONSTRAINT "installer_statement_line_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_statement_line" ADD CONSTRAINT "installer_statement_line_change_order_same_job_fk" FOREIGN KEY ("change_order_id","job_id","organization_id") REFERENCES "public"."change_order"("id","job_id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_time_off" ADD CONSTRAINT "installer_time_off_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_time_off" ADD CONSTRAINT "installer_time_off_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "installer_time_off" ADD CONSTRAINT "installer_time_off_profile_fk" FOREIGN KEY ("organization_id","installer_id") REFERENCES "public"."installer_profile"("organization_id","user_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_completion" ADD CONSTRAINT "job_completion_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_completion" ADD CONSTRAINT "job_completion_completed_by_user_id_fk" FOREIGN KEY ("completed_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "job_completion" ADD CONSTRAINT "job_completion_job_same_store_fk" FOREIGN KEY ("job_id","organization_id") REFERENCES "public"."job"("id","organization_id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "booking_installer_days_idx" ON "booking" USING btree ("organization_id","installer_id","starts_on");--> statement-breakpoint
CREATE INDEX "booking_days_idx" ON "booking" USING btree ("organization_id","starts_on");--> statement-breakpoint
CREATE UNIQUE INDEX "booking_job_live_uq" ON "booking" USING btree ("organization_id","job_id") WHERE "booking"."cancelled_at" is null;--> statement-breakpoint
CREATE INDEX "change_order_job_idx" ON "change_order" USING btree ("organization_id","job_id");--> statement-breakpoint
CREATE UNIQUE INDEX "change_order_one_open_uq" ON "change_order" USING btree ("organization_id","job_id") WHERE "change_order"."status" in ('submitted', 'reviewed');--> statement-breakpoint
CREATE INDEX "field_item_report_idx" ON "field_item" USING btree ("organization_id","report_id");--> statement-breakpoint
CREATE UNIQUE INDEX "field_item_found_once_uq" ON "field_item" USING btree ("organization_id","report_id",coalesce("room_id", ''),"ref_key") WHERE "field_item"."kind" = 'found' and "field_item"."deleted_at" is null;--> statement-breakpoint
CREATE INDEX "field_photo_job_idx" ON "field_photo" USING btree ("organization_id","job_id");--> statement-breakpoint
CREATE INDEX "installer_statement_period_idx" ON "installer_statement" USING btree ("organization_id","period_start");--> statement-breakpoint
CREATE INDEX "installer_statement_line_statement_idx" ON "installer_statement_line" USING btree ("organization_id","statement_id");--> statement-breakpoint
CREATE UNIQUE INDEX "installer_statement_line_install_once_uq" ON "installer_statement_line" USING btree ("organization_id","installer_id","job_id") WHERE "installer_statement_line"."kind" = 'install';--> statement-breakpoint
CREATE UNIQUE INDEX "installer_statement_line_extra_once_uq" ON "installer_statement_line" USING btree ("organization_id","change_order_id") WHERE "installer_statement_line"."kind" = 'extra';--> statement-breakpoint
CREATE INDEX "installer_time_off_installer_idx" ON "installer_time_off" USING btree ("organization_id","installer_id","starts_on");--> statement-breakpoint
ALTER TABLE "payment" ADD CONSTRAINT "payment_change_order_same_job_fk" FOREIGN KEY ("change_order_id","job_id","organization_id") REFERENCES "public"."change_order"("id","job_id","organization_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "payment_change_order_once_uq" ON "payment" USING btree ("organization_id","change_order_id") WHERE "payment"."change_order_id" is not null and "payment"."status" <> 'failed';--> statement-breakpoint
ALTER TABLE "payment" ADD CONSTRAINT "payment_change_order_purpose" CHECK (("payment"."purpose" = 'change_order') = ("payment"."change_order_id" is not null));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "booking" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "change_order" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "field_item" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "field_photo" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "field_report" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "installer_profile" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "installer_statement" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "installer_statement_line" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "installer_time_off" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
CREATE POLICY "store_isolation" ON "job_completion" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));