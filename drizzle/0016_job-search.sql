-- The job list's search through trigram indexes, with row-level security left on and forced.
--
-- Why a function: for the app's role the tables force row-level security, and `ilike` (like
-- pg_trgm's operators) is not LEAKPROOF, so PostgreSQL may only test it after the store policy,
-- never as an index condition: a search read every job of the store (bench/README.md). The
-- function below runs as `flushline_search` (made by scripts/lib/postgres.js: no login, owns only
-- this function), which reads the searched columns through a read policy of its own, so the
-- trigram indexes can be used. It takes the store from `app.store_id`, the setting the store
-- policy itself reads (never from an argument), filters `organization_id =` it explicitly in every
-- branch, refuses to run when it is unset, and returns only job ids: the caller reads the jobs
-- themselves through its own row-level security, as before.
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
-- btree_gin: the store id and the trigrams in one GIN index, so one store's matches are found
-- without a bitmap AND against every store's.
CREATE EXTENSION IF NOT EXISTS btree_gin;--> statement-breakpoint
CREATE INDEX "job_organization_title_trgm_idx" ON "job" USING gin ("organization_id", "title" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "customer_organization_name_trgm_idx" ON "customer" USING gin ("organization_id", "name" gin_trgm_ops);--> statement-breakpoint
GRANT USAGE, CREATE ON SCHEMA public TO flushline_search;--> statement-breakpoint
GRANT SELECT ("id", "organization_id", "title", "customer_id") ON "job" TO flushline_search;--> statement-breakpoint
GRANT SELECT ("id", "organization_id", "name") ON "customer" TO flushline_search;--> statement-breakpoint
CREATE POLICY "search_reads" ON "job" AS PERMISSIVE FOR SELECT TO flushline_search USING (true);--> statement-breakpoint
CREATE POLICY "search_reads" ON "customer" AS PERMISSIVE FOR SELECT TO flushline_search USING (true);--> statement-breakpoint
CREATE FUNCTION job_search_ids(pattern text, cap integer) RETURNS SETOF text
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
		WHERE j.organization_id = store AND j.title ILIKE pattern
		-- Apart, not UNION: no job twice, and LIMIT stops each scan early instead of hashing them all.
		UNION ALL
		SELECT j.id FROM public.job j
		WHERE j.organization_id = store
			AND j.title NOT ILIKE pattern
			AND j.customer_id IN (
				SELECT c.id FROM public.customer c WHERE c.organization_id = store AND c.name ILIKE pattern
			)
		LIMIT cap;
END
$$;--> statement-breakpoint
ALTER FUNCTION job_search_ids(text, integer) OWNER TO flushline_search;
