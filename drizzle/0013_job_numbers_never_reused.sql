CREATE TABLE "job_number_counter" (
	"organization_id" text PRIMARY KEY NOT NULL,
	"last_number" integer NOT NULL,
	CONSTRAINT "job_number_counter_positive" CHECK ("job_number_counter"."last_number" >= 1)
);
--> statement-breakpoint
ALTER TABLE "job_number_counter" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_number_counter" ADD CONSTRAINT "job_number_counter_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE POLICY "store_isolation" ON "job_number_counter" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
-- Every store starts from the highest number it has given (before row security is forced on
-- the owner that runs this migration).
INSERT INTO "job_number_counter" ("organization_id", "last_number")
	SELECT "organization_id", max("number") FROM "job" GROUP BY "organization_id";--> statement-breakpoint
ALTER TABLE "job_number_counter" FORCE ROW LEVEL SECURITY;
