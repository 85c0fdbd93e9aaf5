ALTER TABLE "organization" ADD COLUMN "sales_see_costs" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "organization" ADD COLUMN "sales_jobs" text DEFAULT 'all' NOT NULL;--> statement-breakpoint
-- Which jobs a store's salespeople work on: every job, or only those they sell. The settings
-- action validates it; the database refuses anything else, so a bad value can never widen access.
ALTER TABLE "organization" ADD CONSTRAINT "organization_sales_jobs_check" CHECK ("sales_jobs" IN ('all', 'own'));
