-- Table owners skip row-level security unless it is forced. The app connects as its own role
-- (neither owner nor superuser); forcing it too means even the owner's sessions see one store at a time.
ALTER TABLE "store_profile" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "customer" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_event" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
-- better-auth checks membership in code; the database also refuses a second membership of a user in one store.
CREATE UNIQUE INDEX IF NOT EXISTS "member_organization_user_uq" ON "member" ("organization_id", "user_id");
