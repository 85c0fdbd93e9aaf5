-- The customer's name on `job`, so the job list sorts and searches by it without reading
-- `customer` (bench/README.md, "Migration 0017"): sorted by customer, a page is one range of
-- `job (organization_id, customer_name, number desc)`; searched, the title and the name are both
-- tested on the job's own row, as the list walks its order or through trigram indexes.
--
-- Kept by the database, never by the app: a trigger sets it from the customer whenever a job is
-- inserted or its customer (or the name itself) is written, and a trigger on `customer` carries a
-- rename to the customer's jobs in the same transaction. Both run as the writer (security
-- invoker), through its row-level security: a store's trigger reads and writes only that store.
ALTER TABLE "job" ADD COLUMN "customer_name" text DEFAULT '' NOT NULL;--> statement-breakpoint
-- The backfill reads every store: the owner that runs migrations is exempt from the store policy
-- only while the tables do not force row-level security, which they do again right after.
ALTER TABLE "job" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "customer" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
UPDATE "job" j SET "customer_name" = c."name" FROM "customer" c
	WHERE c."id" = j."customer_id" AND c."organization_id" = j."organization_id";--> statement-breakpoint
ALTER TABLE "job" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "customer" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE FUNCTION job_customer_name() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
BEGIN
	NEW.customer_name := coalesce(
		(SELECT c.name FROM public.customer c
		 WHERE c.id = NEW.customer_id AND c.organization_id = NEW.organization_id),
		-- No such customer in the job's store: the same-store foreign key refuses the row anyway.
		''
	);
	RETURN NEW;
END
$$;--> statement-breakpoint
CREATE TRIGGER job_customer_name BEFORE INSERT OR UPDATE OF "customer_id", "organization_id", "customer_name" ON "job"
	FOR EACH ROW EXECUTE FUNCTION job_customer_name();--> statement-breakpoint
CREATE FUNCTION customer_name_to_jobs() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
BEGIN
	UPDATE public.job SET customer_name = NEW.name
	WHERE organization_id = NEW.organization_id AND customer_id = NEW.id;
	RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER customer_name_to_jobs AFTER UPDATE OF "name" ON "customer"
	FOR EACH ROW WHEN (OLD."name" IS DISTINCT FROM NEW."name") EXECUTE FUNCTION customer_name_to_jobs();--> statement-breakpoint
CREATE INDEX "job_organization_customer_name_idx" ON "job" USING btree ("organization_id","customer_name","number" DESC NULLS FIRST);--> statement-breakpoint
-- One status's jobs by last change, and their count: the enum's `=` (not leakproof) is never an
-- index condition for the app's role, but a partial index whose predicate the query's `status =`
-- implies is chosen all the same (proving the predicate calls no function on a row). Each job is
-- in exactly one of them, so together they are the size of one index.
CREATE INDEX "job_draft_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'draft';--> statement-breakpoint
CREATE INDEX "job_quoted_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'quoted';--> statement-breakpoint
CREATE INDEX "job_accepted_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'accepted';--> statement-breakpoint
CREATE INDEX "job_sold_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'sold';--> statement-breakpoint
CREATE INDEX "job_scheduled_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'scheduled';--> statement-breakpoint
CREATE INDEX "job_in_progress_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'in_progress';--> statement-breakpoint
CREATE INDEX "job_completed_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'completed';--> statement-breakpoint
CREATE INDEX "job_closed_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'closed';--> statement-breakpoint
CREATE INDEX "job_cancelled_updated_idx" ON "job" USING btree ("organization_id","updated_at","number") WHERE "job"."status" = 'cancelled';--> statement-breakpoint
-- The search function (migration 0016) now tests the job's row alone: its role reads the name on
-- `job` and nothing of `customer` any more.
CREATE INDEX "job_organization_customer_name_trgm_idx" ON "job" USING gin ("organization_id", "customer_name" gin_trgm_ops);--> statement-breakpoint
DROP INDEX "customer_organization_name_trgm_idx";--> statement-breakpoint
DROP POLICY "search_reads" ON "customer";--> statement-breakpoint
REVOKE SELECT ("id", "organization_id", "name") ON "customer" FROM flushline_search;--> statement-breakpoint
REVOKE SELECT ("customer_id") ON "job" FROM flushline_search;--> statement-breakpoint
GRANT SELECT ("customer_name") ON "job" TO flushline_search;--> statement-breakpoint
CREATE OR REPLACE FUNCTION job_search_ids(pattern text, cap integer) RETURNS SETOF text
	LANGUAGE plpgsql STABLE SECURITY DEFINER
	SET search_path = pg_catalog, public
	-- Starting parallel workers costs more than these index scans (hundreds of ms on a busy host).
	SET max_parallel_workers_per_gather = 0
AS $$
DECLARE
	store text := nullif(current_setting('app.store_id', true), '');
BEGIN
	IF store IS NULL THEN
		RAISE EXCEPTION 'job_search_ids runs only inside a store transaction (app.store_id is unset)'
			USING ERRCODE = 'insufficient_privilege';
	END IF;
	IF pattern IS NULL OR length(pattern) > 400 OR cap IS NULL OR cap < 1 OR cap > 10001 THEN
		RAISE EXCEPTION 'job_search_ids: a pattern of at most 400 characters and a cap of 1 to 10001'
			USING ERRCODE = 'invalid_parameter_value';
	END IF;
	RETURN QUERY
		SELECT j.id FROM public.job j
		WHERE j.organization_id = store AND (j.title ILIKE pattern OR j.customer_name ILIKE pattern)
		LIMIT cap;
END
$$;
--> statement-breakpoint
-- Sorted by customer, a common search's matches sit together (every job of a matching customer,
-- or each template title's copies, are neighbours in name order), so walking the name index to a
-- page can read tens of thousands of rows first. This reads all the store's matches through the
-- trigram indexes instead, sorts them by the job's copy of the name and number (as the list does),
-- and returns one page of ids with how many match in all. Same guards as `job_search_ids`.
GRANT SELECT ("number") ON "job" TO flushline_search;--> statement-breakpoint
CREATE FUNCTION job_search_by_customer(pattern text, descending boolean, lim integer, skip integer)
	RETURNS TABLE (id text, matches bigint)
	LANGUAGE plpgsql STABLE SECURITY DEFINER
	SET search_path = pg_catalog, public
	SET max_parallel_workers_per_gather = 0
	-- Every match is read for the count: through the trigram indexes, never by walking the whole
	-- store in name order (which the planner, assuming matches spread evenly, would pick).
	SET enable_indexscan = off
	SET enable_seqscan = off
AS $$
DECLARE
	store text := nullif(current_setting('app.store_id', true), '');
BEGIN
	IF store IS NULL THEN
		RAISE EXCEPTION 'job_search_by_customer runs only inside a store transaction (app.store_id is unset)'
			USING ERRCODE = 'insufficient_privilege';
	END IF;
	IF pattern IS NULL OR length(pattern) > 400 OR descending IS NULL
		OR lim IS NULL OR lim < 1 OR lim > 101 OR skip IS NULL OR skip < 0 OR skip > 10000 THEN
		RAISE EXCEPTION 'job_search_by_customer: a pattern of at most 400 characters, a page of 1 to 101 and a start of 0 to 10000'
			USING ERRCODE = 'invalid_parameter_value';
	END IF;
	RETURN QUERY
		SELECT j.id, count(*) OVER ()
		FROM public.job j
		WHERE j.organization_id = store AND (j.title ILIKE pattern OR j.customer_name ILIKE pattern)
		ORDER BY
			CASE WHEN descending THEN NULL ELSE j.customer_name END,
			CASE WHEN descending THEN j.customer_name END DESC,
			j.number DESC
		LIMIT lim OFFSET skip;
END
$$;--> statement-breakpoint
ALTER FUNCTION job_search_by_customer(text, boolean, integer, integer) OWNER TO flushline_search;
