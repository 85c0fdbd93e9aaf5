-- One member's own jobs, found by the member (bench/README.md, "A member's own jobs"): a
-- salesperson who sees only the jobs they sold (the store's setting, or "mine" on the jobs page),
-- an installer those given to them. The list's default order is the job's number, and no index
-- led with the salesperson: for one with few jobs in the scale seed's big store, PostgreSQL read
-- the whole table (200,368 rows, 40-100 ms) to find none. An installer's jobs by number were read
-- through the index by last change and all sorted (22,224 of them, 25 ms a page). In any other
-- order a member's jobs are now read through these and sorted, a few thousand at most.
CREATE INDEX "job_organization_salesperson_number_idx" ON "job" USING btree ("organization_id","salesperson_id","number");--> statement-breakpoint
CREATE INDEX "job_organization_installer_number_idx" ON "job" USING btree ("organization_id","installer_id","number");