-- The customer's phone on `job`, beside the name (migration 0017): a page of the job list then
-- reads `job` alone, with no look at `customer` for each of its rows (bench/README.md, "The
-- customer's phone on the job"). Kept by the database, never by the app, by the triggers that keep
-- the name: the job's trigger takes both from the customer whenever a job is inserted or its
-- customer (or either copy) is written, and the customer's trigger carries a new name or phone to
-- the customer's jobs in the same transaction. Both run as the writer (security invoker), through
-- its row-level security: a store's trigger reads and writes only that store.
ALTER TABLE "job" ADD COLUMN "customer_phone" text;--> statement-breakpoint
-- The backfill reads every store: the owner that runs migrations is exempt from the store policy
-- only while the tables do not force row-level security, which they do again right after.
ALTER TABLE "job" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "customer" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
UPDATE "job" j SET "customer_phone" = c."phone" FROM "customer" c
	WHERE c."id" = j."customer_id" AND c."organization_id" = j."organization_id"
	AND c."phone" IS NOT NULL;--> statement-breakpoint
ALTER TABLE "job" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "customer" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE OR REPLACE FUNCTION job_customer_name() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
DECLARE
	c record;
BEGIN
	SELECT customer.name, customer.phone INTO c FROM public.customer
	WHERE customer.id = NEW.customer_id AND customer.organization_id = NEW.organization_id;
	-- No such customer in the job's store: the same-store foreign key refuses the row anyway.
	NEW.customer_name := coalesce(c.name, '');
	NEW.customer_phone := c.phone;
	RETURN NEW;
END
$$;--> statement-breakpoint
DROP TRIGGER job_customer_name ON "job";--> statement-breakpoint
CREATE TRIGGER job_customer_name BEFORE INSERT OR UPDATE OF "customer_id", "organization_id", "customer_name", "customer_phone" ON "job"
	FOR EACH ROW EXECUTE FUNCTION job_customer_name();--> statement-breakpoint
-- A new name writes both copies; a new phone alone writes the phone only, so the triggers that
-- follow the name (the trigrams of migration 0019) do not run for it.
CREATE OR REPLACE FUNCTION customer_name_to_jobs() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
BEGIN
	IF OLD.name IS DISTINCT FROM NEW.name THEN
		UPDATE public.job SET customer_name = NEW.name, customer_phone = NEW.phone
		WHERE organization_id = NEW.organization_id AND customer_id = NEW.id;
	ELSE
		UPDATE public.job SET customer_phone = NEW.phone
		WHERE organization_id = NEW.organization_id AND customer_id = NEW.id;
	END IF;
	RETURN NULL;
END
$$;--> statement-breakpoint
DROP TRIGGER customer_name_to_jobs ON "customer";--> statement-breakpoint
CREATE TRIGGER customer_name_to_jobs AFTER UPDATE OF "name", "phone" ON "customer"
	FOR EACH ROW WHEN (OLD."name" IS DISTINCT FROM NEW."name" OR OLD."phone" IS DISTINCT FROM NEW."phone")
	EXECUTE FUNCTION customer_name_to_jobs();
