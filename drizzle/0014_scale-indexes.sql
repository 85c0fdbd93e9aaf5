-- pg_trgm (PostgreSQL contrib, a trusted extension: the database owner may create it) for the
-- substring searches of the job list and the customers (bench/README.md).
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
CREATE INDEX "customer_name_trgm_idx" ON "customer" USING gin ("name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "job_organization_status_updated_idx" ON "job" USING btree ("organization_id","status","updated_at","number");--> statement-breakpoint
CREATE INDEX "job_organization_updated_idx" ON "job" USING btree ("organization_id","updated_at","number");--> statement-breakpoint
CREATE INDEX "job_organization_customer_idx" ON "job" USING btree ("organization_id","customer_id","number");--> statement-breakpoint
CREATE INDEX "job_title_trgm_idx" ON "job" USING gin ("title" gin_trgm_ops);