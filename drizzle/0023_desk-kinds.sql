-- The desk (the staff's front page) on a large store, again (bench/README.md, "The desk's kinds,
-- migration 0023"). Migration 0022's index on (organization_id, status, status_changed_at,
-- number) was never used by the app: under row-level security the enum's `=` (not leakproof) is
-- no index condition for the app's role, so each kind still read and sorted all of a state's jobs
-- (11,112 in the scale seed's big store). And whether a draft is measured, and when its quote was
-- last sent, were read from other tables for every job of the state.
-- - Two facts on `job`, kept by the database from `measure` and `quote` in the writer's
--   transaction, never by the app: whether its measure has a room, and when its latest quote
--   version was sent.
-- - One partial index per kind, in the order its lines are listed: the oldest eight are the
--   index's first entries, and the kind's total is counted from the index alone.
DROP INDEX "job_organization_status_since_idx";--> statement-breakpoint
DROP INDEX "measure_measured_idx";--> statement-breakpoint
ALTER TABLE "job" ADD COLUMN "rooms_measured" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "job" ADD COLUMN "quote_sent_at" timestamp with time zone;--> statement-breakpoint
-- Whether a job's measure has a room, from its measure rows: a statement trigger for inserts (one
-- update per store, even for a bulk insert) and a row trigger when a measure's rooms come or go.
-- Like the job tally (0020), it names each row's store in `app.store_id` for its own write and
-- puts back what was there: the store policy holds as for any write, and it follows only rows
-- the policy on `measure` let the writer change.
CREATE FUNCTION job_rooms_measured_follow() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
DECLARE
	was text := current_setting('app.store_id', true);
	g record;
BEGIN
	IF TG_OP = 'INSERT' THEN
		FOR g IN SELECT DISTINCT n.organization_id FROM new_measures n ORDER BY 1 LOOP
			PERFORM set_config('app.store_id', g.organization_id, true);
			UPDATE public.job j SET rooms_measured = m.measured
			FROM (
				SELECT n.job_id,
					jsonb_array_length(coalesce(n.draft -> 'rooms', '[]'::jsonb)) > 0 AS measured
				FROM new_measures n WHERE n.organization_id = g.organization_id
			) m
			WHERE j.organization_id = g.organization_id AND j.id = m.job_id
				AND j.rooms_measured IS DISTINCT FROM m.measured;
		END LOOP;
	ELSIF TG_OP = 'DELETE' THEN
		-- A job has one measure (measure_job_uq): without it, no room.
		PERFORM set_config('app.store_id', OLD.organization_id, true);
		UPDATE public.job j SET rooms_measured = false
		WHERE j.organization_id = OLD.organization_id AND j.id = OLD.job_id AND j.rooms_measured;
	ELSE
		-- A measure's rooms came or went: its job (and the one it left, were it ever moved) asked
		-- afresh.
		FOR g IN SELECT DISTINCT r.organization_id, r.job_id FROM (
			VALUES (OLD.organization_id, OLD.job_id), (NEW.organization_id, NEW.job_id)
		) r(organization_id, job_id) ORDER BY 1, 2 LOOP
			PERFORM set_config('app.store_id', g.organization_id, true);
			UPDATE public.job j SET rooms_measured = EXISTS (
				SELECT 1 FROM public.measure m
				WHERE m.organization_id = g.organization_id AND m.job_id = g.job_id
					AND jsonb_array_length(coalesce(m.draft -> 'rooms', '[]'::jsonb)) > 0
			)
			WHERE j.organization_id = g.organization_id AND j.id = g.job_id;
		END LOOP;
	END IF;
	PERFORM set_config('app.store_id', coalesce(was, ''), true);
	RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER job_rooms_measured_insert AFTER INSERT ON "measure"
	REFERENCING NEW TABLE AS new_measures
	FOR EACH STATEMENT EXECUTE FUNCTION job_rooms_measured_follow();--> statement-breakpoint
CREATE TRIGGER job_rooms_measured_update AFTER UPDATE OF "draft", "job_id", "organization_id" ON "measure"
	FOR EACH ROW
	WHEN ((jsonb_array_length(coalesce(OLD."draft" -> 'rooms', '[]'::jsonb)) > 0)
			IS DISTINCT FROM (jsonb_array_length(coalesce(NEW."draft" -> 'rooms', '[]'::jsonb)) > 0)
		OR OLD."job_id" IS DISTINCT FROM NEW."job_id"
		OR OLD."organization_id" IS DISTINCT FROM NEW."organization_id")
	EXECUTE FUNCTION job_rooms_measured_follow();--> statement-breakpoint
CREATE TRIGGER job_rooms_measured_delete AFTER DELETE ON "measure"
	FOR EACH ROW EXECUTE FUNCTION job_rooms_measured_follow();--> statement-breakpoint
-- When a job's latest quote version was sent: a sent version is frozen (quote_frozen_guard), so
-- the time only ever moves on, and a statement trigger for inserts (the scale seed's template and
-- restores write sent versions in bulk) and a row trigger when a version is sent keep it.
CREATE FUNCTION job_quote_sent_follow() RETURNS trigger
	LANGUAGE plpgsql
	SET search_path = pg_catalog, public
AS $$
DECLARE
	was text := current_setting('app.store_id', true);
	g record;
BEGIN
	IF TG_OP = 'INSERT' THEN
		FOR g IN SELECT DISTINCT n.organization_id FROM new_quotes n
			WHERE n.sent_at IS NOT NULL ORDER BY 1 LOOP
			PERFORM set_config('app.store_id', g.organization_id, true);
			UPDATE public.job j SET quote_sent_at = m.sent_at
			FROM (
				SELECT n.job_id, max(n.sent_at) AS sent_at FROM new_quotes n
				WHERE n.organization_id = g.organization_id AND n.sent_at IS NOT NULL GROUP BY 1
			) m
			WHERE j.organization_id = g.organization_id AND j.id = m.job_id
				AND (j.quote_sent_at IS NULL OR j.quote_sent_at < m.sent_at);
		END LOOP;
	ELSE
		PERFORM set_config('app.store_id', NEW.organization_id, true);
		UPDATE public.job j SET quote_sent_at = NEW.sent_at
		WHERE j.organization_id = NEW.organization_id AND j.id = NEW.job_id
			AND (j.quote_sent_at IS NULL OR j.quote_sent_at < NEW.sent_at);
	END IF;
	PERFORM set_config('app.store_id', coalesce(was, ''), true);
	RETURN NULL;
END
$$;--> statement-breakpoint
CREATE TRIGGER job_quote_sent_insert AFTER INSERT ON "quote"
	REFERENCING NEW TABLE AS new_quotes
	FOR EACH STATEMENT EXECUTE FUNCTION job_quote_sent_follow();--> statement-breakpoint
CREATE TRIGGER job_quote_sent_update AFTER UPDATE OF "sent_at" ON "quote"
	FOR EACH ROW WHEN (NEW."sent_at" IS NOT NULL AND OLD."sent_at" IS DISTINCT FROM NEW."sent_at")
	EXECUTE FUNCTION job_quote_sent_follow();--> statement-breakpoint
-- Both facts for the jobs already there. The owner that runs migrations reads and writes every
-- store only while the tables do not force row-level security, which they do again right after.
ALTER TABLE "job" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "measure" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "quote" NO FORCE ROW LEVEL SECURITY;--> statement-breakpoint
UPDATE "job" j SET "rooms_measured" = true FROM "measure" m
	WHERE m."organization_id" = j."organization_id" AND m."job_id" = j."id"
		AND jsonb_array_length(coalesce(m."draft" -> 'rooms', '[]'::jsonb)) > 0;--> statement-breakpoint
UPDATE "job" j SET "quote_sent_at" = q."sent_at"
	FROM (SELECT "organization_id", "job_id", max("sent_at") AS "sent_at" FROM "quote"
		WHERE "sent_at" IS NOT NULL GROUP BY 1, 2) q
	WHERE q."organization_id" = j."organization_id" AND q."job_id" = j."id";--> statement-breakpoint
ALTER TABLE "job" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "measure" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
ALTER TABLE "quote" FORCE ROW LEVEL SECURITY;--> statement-breakpoint
CREATE INDEX "change_order_submitted_idx" ON "change_order" USING btree ("organization_id","created_at") WHERE "change_order"."status" = 'submitted';--> statement-breakpoint
CREATE INDEX "job_draft_unmeasured_since_idx" ON "job" USING btree ("organization_id","status_changed_at","number") WHERE "job"."status" = 'draft' and not "job"."rooms_measured";--> statement-breakpoint
CREATE INDEX "job_draft_measured_since_idx" ON "job" USING btree ("organization_id","status_changed_at","number") WHERE "job"."status" = 'draft' and "job"."rooms_measured";--> statement-breakpoint
CREATE INDEX "job_quoted_since_idx" ON "job" USING btree ("organization_id",coalesce("quote_sent_at", "status_changed_at"),"number") WHERE "job"."status" = 'quoted';--> statement-breakpoint
CREATE INDEX "job_accepted_since_idx" ON "job" USING btree ("organization_id","status_changed_at","number") WHERE "job"."status" = 'accepted';--> statement-breakpoint
CREATE INDEX "job_sold_since_idx" ON "job" USING btree ("organization_id","status_changed_at","number") WHERE "job"."status" = 'sold';--> statement-breakpoint
CREATE INDEX "job_completed_since_idx" ON "job" USING btree ("organization_id","status_changed_at","number") WHERE "job"."status" = 'completed';--> statement-breakpoint
CREATE INDEX "payment_mismatch_idx" ON "payment" USING btree ("organization_id","updated_at") WHERE "payment"."mismatch" is not null;