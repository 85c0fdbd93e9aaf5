-- The job's title and customer's name in lower case, kept by the database, for the job list's
-- search (bench/README.md, "The search's text tested in lower case"). In a UTF-8 database `ilike`
-- lowers the text it tests and the pattern, then compares them as `like` does; on the big store of
-- the scale seed that lowering of every row of the search's window (457 rows for "oak", two texts
-- each) was 0.45 ms of the statement's 1.45 ms. Stored, the search compares the kept lower case
-- with the pattern lowered once. One statement: the table is written again once, not twice.
ALTER TABLE "job" ADD COLUMN "title_lower" text GENERATED ALWAYS AS (lower(title)) STORED NOT NULL,
	ADD COLUMN "customer_name_lower" text GENERATED ALWAYS AS (lower(customer_name)) STORED NOT NULL;
