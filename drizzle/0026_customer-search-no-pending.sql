-- The customers search's trigram indexes (migration 0021) without GIN's pending list
-- (bench/README.md, "The customers search after a customer is written"). With `fastupdate` on, a
-- written customer's new index entries wait in a pending list until a vacuum, and while one waits
-- the planner prices every scan of these indexes higher. `customer_search_ids` runs as
-- `flushline_search`, for which row-level security keeps the planner from the columns'
-- statistics, so it guesses the matches from defaults (219 of 2,004 for "ash", against 84). With
-- one pending page on each index it chose to read the store's 2,004 customers through
-- `organization_id` alone and test each (2.3 ms) over the three trigram scans (0.4 ms), until the
-- next vacuum. Customers are written at a person's pace: each entry now goes straight into the
-- index.
ALTER INDEX "customer_organization_name_trgm_idx" SET (fastupdate = off);--> statement-breakpoint
ALTER INDEX "customer_organization_email_trgm_idx" SET (fastupdate = off);--> statement-breakpoint
ALTER INDEX "customer_organization_phone_trgm_idx" SET (fastupdate = off);--> statement-breakpoint
-- What already waits goes into the indexes now.
SELECT gin_clean_pending_list('customer_organization_name_trgm_idx'::regclass),
	gin_clean_pending_list('customer_organization_email_trgm_idx'::regclass),
	gin_clean_pending_list('customer_organization_phone_trgm_idx'::regclass);
