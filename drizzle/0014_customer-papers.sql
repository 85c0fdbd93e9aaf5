ALTER TABLE "store_profile" ADD COLUMN "papers_next_steps" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "store_profile" ADD COLUMN "papers_cancellation" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "store_profile" ADD COLUMN "papers_terms" text DEFAULT '' NOT NULL;