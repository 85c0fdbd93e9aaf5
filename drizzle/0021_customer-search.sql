-- The customers search through trigram indexes (bench/README.md, "Migration 0021"). The search
-- tested every one of the store's customers row by row, three `ilike`s each, behind the store
-- policy: in the big store of the scale seed, 2,004 customers for 84 matches of "ash", 4.4 ms of
-- PostgreSQL on every keystroke's request. For the app's role `ilike` cannot be an index condition
-- (it is not LEAKPROOF and row-level security is forced; migration 0016), so, as for the jobs, a
-- function that runs as `flushline_search` reads the searched columns through a read policy of its
-- own, takes the store only from `app.store_id`, refuses to run without it, filters
-- `organization_id =` it explicitly, and returns only ids: the caller reads the customers through
-- its own row-level security.
CREATE INDEX "customer_organization_name_trgm_idx" ON "customer" USING gin ("organization_id", "name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "customer_organization_email_trgm_idx" ON "customer" USING gin ("organization_id", "email" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "customer_organization_phone_trgm_idx" ON "customer" USING gin ("organization_id", "phone" gin_trgm_ops);--> statement-breakpoint
GRANT SELECT ("id", "organization_id", "name", "email", "phone") ON "customer" TO flushline_search;--> statement-breakpoint
CREATE POLICY "search_reads" ON "customer" AS PERMISSIVE FOR SELECT TO flushline_search USING (true);--> statement-breakpoint
CREATE FUNCTION customer_search_ids(pattern text, cap integer) RETURNS SETOF text
	LANGUAGE plpgsql STABLE SECURITY DEFINER
	SET search_path = pg_catalog, public
	-- Starting parallel workers costs more than these index scans.
	SET max_parallel_workers_per_gather = 0
	-- Through the indexes, never by reading the table: a store's customers fit in few pages, so the
	-- planner would read them all, and three `ilike`s a row cost 4 ms for 2,000 customers.
	SET enable_seqscan = off
AS $$
DECLARE
	store text := nullif(current_setting('app.store_id', true), '');
BEGIN
	IF store IS NULL THEN
		RAISE EXCEPTION 'customer_search_ids runs only inside a store transaction (app.store_id is unset)'
			USING ERRCODE = 'insufficient_privilege';
	END IF;
	IF pattern IS NULL OR length(pattern) > 400 OR cap IS NULL OR cap < 1 OR cap > 10001 THEN
		RAISE EXCEPTION 'customer_search_ids: a pattern of at most 400 characters and a cap of 1 to 10001'
			USING ERRCODE = 'invalid_parameter_value';
	END IF;
	-- Planned on each run with the text itself (EXECUTE): a plan kept for any text would not know
	-- how few customers the text's trigrams narrow to, and tested the store's every customer.
	RETURN QUERY EXECUTE
		'SELECT c.id FROM public.customer c
		 WHERE c.organization_id = $1 AND (c.name ILIKE $2 OR c.email ILIKE $2 OR c.phone ILIKE $2)
		 LIMIT $3'
		USING store, pattern, cap;
END
$$;--> statement-breakpoint
ALTER FUNCTION customer_search_ids(text, integer) OWNER TO flushline_search;
