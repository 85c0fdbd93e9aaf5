-- The desk (the staff's front page) on a large store (bench/README.md, "The desk on the big
-- store"). Each of its kinds lists its oldest few jobs and counts them all. In the scale seed's big
-- store (11,112 jobs in each state) it took 2.1-2.9 s: every draft job's measure draft read to see
-- whether it has a room, the jobs in a state sorted whole for their oldest eight, and the change
-- orders to review found by testing every one of the store's 100,008 jobs.
-- - A store's jobs in one state by when they entered it: the oldest few are the index's first
--   entries. It replaces the index on (organization_id, status), which it starts with.
-- - The measures with a room, as a partial index: "is this job measured?" is answered from it.
DROP INDEX "job_organization_status_idx";--> statement-breakpoint
CREATE INDEX "job_organization_status_since_idx" ON "job" USING btree ("organization_id","status","status_changed_at","number");--> statement-breakpoint
CREATE INDEX "measure_measured_idx" ON "measure" USING btree ("organization_id","job_id") WHERE jsonb_array_length(coalesce("measure"."draft" -> 'rooms', '[]'::jsonb)) > 0;