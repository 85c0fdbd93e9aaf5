ALTER TABLE "organization" ADD COLUMN "sales_see_costs" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "organization" ADD COLUMN "sales_jobs" text DEFAULT 'all' NOT NULL;