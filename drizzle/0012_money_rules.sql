ALTER TYPE "public"."quote_status" ADD VALUE 'withdrawn';--> statement-breakpoint
ALTER TABLE "job" ADD COLUMN "link_version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "payment" ADD COLUMN "mismatch" text;