CREATE TABLE "job_name_trigram" (
	"organization_id" text NOT NULL,
	"trigram" text NOT NULL,
	"customer_name" text NOT NULL,
	CONSTRAINT "job_name_trigram_organization_id_trigram_customer_name_pk" PRIMARY KEY("organization_id","trigram","customer_name")
);
--> statement-breakpoint
ALTER TABLE "job_name_trigram" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_name_trigram" ADD CONSTRAINT "job_name_trigram_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE POLICY "store_isolation" ON "job_name_trigram" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
ALTER TABLE "job_name_trigram" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
-- The job list's search sorted by customer (bench/README.md, "Migration 0019"). Searching a common
-- word, every match had to be read through the trigram indexes and sorted by name for one page
-- (`job_search_by_customer`, migration 0017): 11,112 rows for "oak" in a store of 100,000 jobs.
-- This table says which customer names have a job holding each trigram, in name order: the search
-- walks one trigram's names from the start of the order and tests only their jobs, so a page is
-- found after a few names.
--
-- The trigrams are pg_trgm's (`show_trgm`: lower case, words split at anything not a letter or
-- digit), only those inside a word (no padding): any text that holds the searched words holds
-- every inner trigram of each. Title and name are one text here; a match lies in one of them.
--
-- Kept by the database: a statement trigger adds a new job's trigrams (one insert for a bulk
-- insert too), and a row trigger those of a job whose title or name changed. Both run as the
-- writer, through the store policy: a store's trigger writes only that store's rows. Nothing is
-- deleted: a name or title changed away leaves rows that cost a look at jobs no longer matching,
-- never a wrong answer (the jobs themselves are tested with `ilike`).
-- The inner trigrams of a text: pg_trgm's, without the padded ones at a word's ends.
CREATE FUNCTION job_inner_trigrams(words text) RETURNS SETOF text
	LANGUAGE sql IMMUTABLE STRICT
	SET search_path = pg_catalog, public
AS $$
	SELECT DISTINCT t FROM unnest(public.show_trgm(words)) t WHERE strpos(t, ' ') = 0;
$$;--> statement-breakpoint
CREATE FUNCTION job_name_trigrams_of_new() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
BEGIN
	INSERT INTO public.job_name_trigram (organization_id, trigram, customer_name)
	SELECT DISTINCT n.organization_id, t, n.customer_name
	FROM new_jobs n, public.job_inner_trigrams(n.title || ' ' || n.customer_name) t
	ON CONFLICT DO NOTHING;
	RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER job_name_trigrams_insert AFTER INSERT ON "job"
	REFERENCING NEW TABLE AS new_jobs
	FOR EACH STATEMENT EXECUTE FUNCTION job_name_trigrams_of_new();--> statement-breakpoint
CREATE FUNCTION job_name_trigrams_of_changed() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
BEGIN
	INSERT INTO public.job_name_trigram (organization_id, trigram, customer_name)
	SELECT NEW.organization_id, t, NEW.customer_name
	FROM public.job_inner_trigrams(NEW.title || ' ' || NEW.customer_name) t
	ON CONFLICT DO NOTHING;
	RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER job_name_trigrams_update AFTER UPDATE OF "title", "customer_name", "organization_id" ON "job"
	FOR EACH ROW
	WHEN (OLD."title" IS DISTINCT FROM NEW."title" OR OLD."customer_name" IS DISTINCT FROM NEW."customer_name"
		OR OLD."organization_id" IS DISTINCT FROM NEW."organization_id")
	EXECUTE FUNCTION job_name_trigrams_of_changed();--> statement-breakpoint
-- Every store's jobs so far (and the scale seed's, which copies with triggers off): the owner that
-- runs migrations reads and writes all stores only while row-level security is not forced.
CREATE FUNCTION job_name_trigrams_fill(store text) RETURNS void
	LANGUAGE sql
	SET search_path = pg_catalog, public
AS $$
	INSERT INTO public.job_name_trigram (organization_id, trigram, customer_name)
	SELECT DISTINCT j.organization_id, t, j.customer_name
	FROM public.job j, public.job_inner_trigrams(j.title || ' ' || j.customer_name) t
	WHERE store IS NULL OR j.organization_id = store
	ON CONFLICT DO NOTHING;
$$;--> statement-breakpoint
ALTER TABLE "job" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_name_trigram" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
SELECT job_name_trigrams_fill(NULL);--> statement-breakpoint
ALTER TABLE "job" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_name_trigram" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
GRANT SELECT ("organization_id", "trigram", "customer_name") ON "job_name_trigram" TO flushline_search;--> statement-breakpoint
CREATE POLICY "search_reads" ON "job_name_trigram" AS PERMISSIVE FOR SELECT TO flushline_search USING (true);--> statement-breakpoint
-- A page of the jobs whose title or customer's name matches `pattern` (an `ilike` pattern of the
-- searched text `words`), in the list's order sorted by customer: names ascending (or descending),
-- each name's jobs newest number first. Walks the names holding the searched text's rarest inner
-- trigram, in that order, and reads each name's jobs newest first
-- (`job_organization_customer_name_idx`) until `skip + lim` match. Returns the page's ids, with how many match in all when the walk read every
-- candidate before the page was full (else `matches` is NULL: at least `skip + lim`); or no ids
-- when there is nothing to walk (no trigram of three letters or digits inside a word) or when
-- more than `budget` jobs were read first: the
-- caller then reads all matches through the trigram indexes (`job_search_by_customer`). Runs as
-- `flushline_search`, with the guards of `job_search_ids` (migration 0016).
CREATE FUNCTION job_search_by_name_walk(
	words text, pattern text, descending boolean, lim integer, skip integer, budget integer,
	OUT ids text[], OUT matches integer)
	LANGUAGE plpgsql STABLE SECURITY DEFINER
	SET search_path = pg_catalog, public
	SET max_parallel_workers_per_gather = 0
	-- A name's jobs in number order from the name's index, stopping when the page is full: never a
	-- bitmap of all of them sorted first (which the planner, expecting to read them all, would pick).
	SET enable_bitmapscan = off
AS $$
DECLARE
	store text := nullif(current_setting('app.store_id', true), '');
	rarest text;
	names refcursor;
	name text;
	hits text[] := '{}';
	name_ids text[];
	name_jobs integer;
	taken integer := 0;
BEGIN
	IF store IS NULL THEN
		RAISE EXCEPTION 'job_search_by_name_walk runs only inside a store transaction (app.store_id is unset)'
			USING ERRCODE = 'insufficient_privilege';
	END IF;
	IF words IS NULL OR length(words) > 200 OR pattern IS NULL OR length(pattern) > 400
		OR descending IS NULL OR lim IS NULL OR lim < 1 OR lim > 101 OR skip IS NULL OR skip < 0
		OR skip > 10000 OR budget IS NULL OR budget < 1 OR budget > 100000 THEN
		RAISE EXCEPTION 'job_search_by_name_walk: text of at most 200 characters, a pattern of at most 400, a page of 1 to 101, a start of 0 to 10000 and a budget of 1 to 100000'
			USING ERRCODE = 'invalid_parameter_value';
	END IF;
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
		-- The name's jobs newest first, read only until the page is full (the outer limit stops the
		-- scan) and never past what is left of the budget (the inner one).
		name_ids := ARRAY(
			SELECT r.id FROM (
				SELECT j.id, j.title, j.customer_name FROM public.job j
				WHERE j.organization_id = store AND j.customer_name = name
				ORDER BY j.number DESC
				LIMIT budget - taken
			) r
			WHERE r.title ILIKE pattern OR r.customer_name ILIKE pattern
			LIMIT skip + lim - cardinality(hits));
		hits := hits || name_ids;
		IF cardinality(hits) >= skip + lim THEN
			ids := hits[skip + 1 : skip + lim];
			RETURN;
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
			RETURN;
		END IF;
	END LOOP;
	CLOSE names;
	ids := coalesce(hits[skip + 1 : skip + lim], '{}');
	matches := cardinality(hits);
END
$$;--> statement-breakpoint
ALTER FUNCTION job_search_by_name_walk(text, text, boolean, integer, integer, integer) OWNER TO flushline_search;
