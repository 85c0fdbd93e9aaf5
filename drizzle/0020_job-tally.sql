CREATE TABLE "job_tally" (
	"organization_id" text NOT NULL,
	"status" "job_status" NOT NULL,
	"salesperson_id" text DEFAULT '' NOT NULL,
	"jobs" integer NOT NULL,
	CONSTRAINT "job_tally_organization_id_status_salesperson_id_pk" PRIMARY KEY("organization_id","status","salesperson_id")
);
--> statement-breakpoint
ALTER TABLE "job_tally" ENABLE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_tally" ADD CONSTRAINT "job_tally_organization_id_organization_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE POLICY "store_isolation" ON "job_tally" AS PERMISSIVE FOR ALL TO public USING (organization_id = current_setting('app.store_id', true)) WITH CHECK (organization_id = current_setting('app.store_id', true));--> statement-breakpoint
ALTER TABLE "job_tally" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
-- How many of a store's jobs are in each status, per salesperson (bench/README.md, "Migration
-- 0020"). The job list counted its matches on every request, as far as 1,000 past the page's
-- start, and a late page of a store of 100,000 jobs skipped and counted 100,000 index entries
-- (14-17 ms of PostgreSQL). With the total read here, the list says exactly how many jobs there
-- are and reads a page past the middle from the far end of its order.
--
-- Kept by the database in the transaction that changes the jobs: a statement trigger each for
-- insert and delete (one write per store, status and salesperson, even for a bulk insert), and a
-- row trigger when a job's status, salesperson or store changes. Rows are written in key order
-- within a statement, so two writers never wait on each other's rows in a cycle within one
-- statement.
--
-- A change to `job` is not always made under its store's setting: removing a user sets their jobs'
-- salesperson to NULL as the table's owner, in no store. So the trigger names each row's store in
-- `app.store_id` for its own write and puts back what was there: the store policy holds as for any
-- write, and the tally follows only rows that were changed, which the policy on `job` allowed. It
-- is a trigger function (which nothing can call directly), not a function of its own that anyone
-- could call with another store's id.
CREATE FUNCTION job_tally_follow() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
DECLARE
	was text := current_setting('app.store_id', true);
	changes refcursor;
	g record;
BEGIN
	IF TG_OP = 'INSERT' THEN
		OPEN changes FOR
			SELECT n.organization_id, n.status, coalesce(n.salesperson_id, '') AS salesperson_id,
				count(*)::int AS delta
			FROM new_jobs n GROUP BY 1, 2, 3 ORDER BY 1, 2, 3;
	ELSIF TG_OP = 'DELETE' THEN
		OPEN changes FOR
			SELECT o.organization_id, o.status, coalesce(o.salesperson_id, '') AS salesperson_id,
				-count(*)::int AS delta
			FROM old_jobs o GROUP BY 1, 2, 3 ORDER BY 1, 2, 3;
	ELSE
		-- One job moved between statuses, salespeople or (never by the app) stores.
		OPEN changes FOR
			SELECT * FROM (
				VALUES (OLD.organization_id, OLD.status, coalesce(OLD.salesperson_id, ''), -1),
					(NEW.organization_id, NEW.status, coalesce(NEW.salesperson_id, ''), 1)
			) m(organization_id, status, salesperson_id, delta)
			ORDER BY 1, 2, 3;
	END IF;
	LOOP
		FETCH changes INTO g;
		EXIT WHEN NOT FOUND;
		PERFORM set_config('app.store_id', g.organization_id, true);
		INSERT INTO public.job_tally AS t (organization_id, status, salesperson_id, jobs)
		VALUES (g.organization_id, g.status, g.salesperson_id, g.delta)
		ON CONFLICT (organization_id, status, salesperson_id)
		DO UPDATE SET jobs = t.jobs + excluded.jobs;
	END LOOP;
	CLOSE changes;
	PERFORM set_config('app.store_id', coalesce(was, ''), true);
	RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER job_tally_insert AFTER INSERT ON "job"
	REFERENCING NEW TABLE AS new_jobs
	FOR EACH STATEMENT EXECUTE FUNCTION job_tally_follow();--> statement-breakpoint
CREATE TRIGGER job_tally_delete AFTER DELETE ON "job"
	REFERENCING OLD TABLE AS old_jobs
	FOR EACH STATEMENT EXECUTE FUNCTION job_tally_follow();--> statement-breakpoint
CREATE TRIGGER job_tally_update AFTER UPDATE OF "status", "salesperson_id", "organization_id" ON "job"
	FOR EACH ROW
	WHEN (OLD."status" IS DISTINCT FROM NEW."status"
		OR OLD."salesperson_id" IS DISTINCT FROM NEW."salesperson_id"
		OR OLD."organization_id" IS DISTINCT FROM NEW."organization_id")
	EXECUTE FUNCTION job_tally_follow();--> statement-breakpoint
-- A store's tally counted afresh from its jobs (every store's when `store` is NULL): for this
-- migration, and for the scale seed, which copies jobs with triggers off. The owner that runs
-- migrations reads and writes all stores only while row-level security is not forced.
CREATE FUNCTION job_tally_fill(store text) RETURNS void
	LANGUAGE sql
	SET search_path = pg_catalog, public
AS $$
	DELETE FROM public.job_tally WHERE store IS NULL OR organization_id = store;
	INSERT INTO public.job_tally (organization_id, status, salesperson_id, jobs)
	SELECT j.organization_id, j.status, coalesce(j.salesperson_id, ''), count(*)
	FROM public.job j
	WHERE store IS NULL OR j.organization_id = store
	GROUP BY 1, 2, 3;
$$;--> statement-breakpoint
ALTER TABLE "job" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_tally" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
SELECT job_tally_fill(NULL);--> statement-breakpoint
ALTER TABLE "job" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "job_tally" FORCE ROW LEVEL SECURITY;
