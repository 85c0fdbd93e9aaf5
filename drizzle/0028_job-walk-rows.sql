-- The job list's search sorted by customer hands over its page's jobs themselves, not their ids
-- (bench/README.md, "The walk hands over its page"). The walk of names (migration 0019) read each
-- job of its page once to test it, and the list then read them all again by id, one index descent
-- each: on the big store of the scale seed, 0.15 ms of the 0.85 ms that "oak" sorted by customer
-- took in PostgreSQL. `job_search_by_name_page` walks as `job_search_by_name_walk` did and returns
-- the page's rows, which the list reads as its `job` (`unnest`).
--
-- It tests the kept lower case against the pattern lowered once (migration 0027), as the list's
-- window does: what `ilike` finds.
--
-- It runs as its caller, not as `flushline_search`: it reads only by the store and a name, with
-- equality (leakproof), so row-level security keeps the store's own index conditions, and a
-- function that returns whole jobs gets no more than the app may read.
DROP FUNCTION job_search_by_name_walk(text, text, boolean, integer, integer, integer);--> statement-breakpoint
-- A page of the jobs whose title or customer's name matches `pattern` (an `ilike` pattern of the
-- searched text `words`), in the list's order sorted by customer: names ascending (or descending),
-- each name's jobs newest number first. Walks the names holding the searched text's rarest inner
-- trigram (`job_name_trigram`, migration 0019) in that order, and reads each name's jobs newest
-- first (`job_organization_customer_name_idx`) until `skip + lim` match.
--
-- `jobs`: the `lim` matches after the first `skip` (fewer at the end). `walked`: false when there
-- was nothing to walk (no trigram of three letters or digits inside a word) or when more than
-- `budget` jobs were read first; the caller then reads all matches through the trigram indexes
-- (`job_search_by_customer`). `matches`: how many match in all when the walk read every candidate
-- before the page was full, else NULL (at least `skip + lim`). Only the page's rows are kept: a
-- name whose matches all lie before the page is counted, not copied.
CREATE FUNCTION job_search_by_name_page(
	words text, pattern text, descending boolean, lim integer, skip integer, budget integer,
	OUT jobs public.job[], OUT walked boolean, OUT matches integer)
	LANGUAGE plpgsql STABLE
	SET search_path = pg_catalog, public
	SET max_parallel_workers_per_gather = 0
	-- A name's jobs in number order from the name's index, stopping when the page is full: never a
	-- bitmap of all of them sorted first (which the planner, expecting to read them all, would pick).
	SET enable_bitmapscan = off
AS $$
DECLARE
	store text := nullif(current_setting('app.store_id', true), '');
	lowered text := lower(pattern);
	rarest text;
	names refcursor;
	name text;
	passed integer;
	seen integer := 0;
	name_jobs integer;
	taken integer := 0;
BEGIN
	IF store IS NULL THEN
		RAISE EXCEPTION 'job_search_by_name_page runs only inside a store transaction (app.store_id is unset)'
			USING ERRCODE = 'insufficient_privilege';
	END IF;
	IF words IS NULL OR length(words) > 200 OR pattern IS NULL OR length(pattern) > 400
		OR descending IS NULL OR lim IS NULL OR lim < 1 OR lim > 101 OR skip IS NULL OR skip < 0
		OR skip > 10000 OR budget IS NULL OR budget < 1 OR budget > 100000 THEN
		RAISE EXCEPTION 'job_search_by_name_page: text of at most 200 characters, a pattern of at most 400, a page of 1 to 101, a start of 0 to 10000 and a budget of 1 to 100000'
			USING ERRCODE = 'invalid_parameter_value';
	END IF;
	jobs := '{}';
	walked := false;
	-- The inner trigram with the fewest names: of at most 24 (any one will do; a long text has a
	-- hundred), each counted on the index to 2,001 at most.
	SELECT c.t INTO rarest
	FROM (SELECT t FROM public.job_inner_trigrams(words) t LIMIT 24) c
	ORDER BY (SELECT count(*) FROM (SELECT 1 FROM public.job_name_trigram n
		WHERE n.organization_id = store AND n.trigram = c.t LIMIT 2001) k), c.t
	LIMIT 1;
	IF rarest IS NULL THEN
		RETURN;
	END IF;
	-- In the primary key's order, read only as far as the page needs.
	IF descending THEN
		OPEN names FOR SELECT n.customer_name FROM public.job_name_trigram n
			WHERE n.organization_id = store AND n.trigram = rarest ORDER BY n.customer_name DESC;
	ELSE
		OPEN names FOR SELECT n.customer_name FROM public.job_name_trigram n
			WHERE n.organization_id = store AND n.trigram = rarest ORDER BY n.customer_name;
	END IF;
	LOOP
		FETCH names INTO name;
		EXIT WHEN NOT FOUND;
		-- The name's matches that lie before the page, counted (never past what is left of the
		-- budget), then the page's from there: read only until the page is full.
		passed := 0;
		IF seen < skip THEN
			SELECT count(*) INTO passed FROM (
				SELECT 1 FROM (
					SELECT j.title_lower, j.customer_name_lower FROM public.job j
					WHERE j.organization_id = store AND j.customer_name = name
					ORDER BY j.number DESC
					LIMIT budget - taken
				) r
				WHERE r.title_lower LIKE lowered OR r.customer_name_lower LIKE lowered
				LIMIT skip - seen) c;
			seen := seen + passed;
		END IF;
		IF seen >= skip THEN
			jobs := jobs || ARRAY(
				SELECT ROW(r.*)::public.job FROM (
					SELECT j.* FROM public.job j
					WHERE j.organization_id = store AND j.customer_name = name
					ORDER BY j.number DESC
					LIMIT budget - taken
				) r
				WHERE r.title_lower LIKE lowered OR r.customer_name_lower LIKE lowered
				OFFSET passed
				LIMIT lim - cardinality(jobs));
			IF cardinality(jobs) >= lim THEN
				walked := true;
				RETURN;
			END IF;
			seen := skip + cardinality(jobs);
		END IF;
		-- Short of the page: every job of the name was read, unless the budget ran out first (the
		-- name's jobs counted on the index alone, to one past it). A name whose jobs are all gone
		-- still costs a look: counted as one.
		SELECT count(*) INTO name_jobs FROM (
			SELECT 1 FROM public.job j
			WHERE j.organization_id = store AND j.customer_name = name
			LIMIT budget - taken + 1) c;
		taken := taken + greatest(name_jobs, 1);
		IF taken > budget THEN
			jobs := '{}';
			RETURN;
		END IF;
	END LOOP;
	CLOSE names;
	walked := true;
	matches := seen;
END
$$;
