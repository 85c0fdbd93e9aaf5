#!/usr/bin/env bash
# EXPLAIN ANALYZE of the job list and customer search queries (as src/lib/server/db/queries sends
# them, through row-level security as the app's role) on the scale seed, each run once to warm
# the session's caches and then shown.
#   bash bench/explain.sh [store number, default 1; 1000 is seed:scale --big's store] [old|0015|new]
# `old` is the query shape before the scale indexes (count joined to customer, the customer's name
# matched in the join), `0015` the shape of migration 0015 (exact count on `job` alone, the
# customer's name as a list of ids), `new` (the default) today's (migration 0017; the 0016 shapes
# are in bench/plans-0016.txt): capped counts, the search's first-rows walk, the search
# functions, whose own queries are shown as their role runs them, and the walk of names sorted by
# customer (migration 0019). FLUSHLINE_BENCH_PG_PORT: the cluster (54322).
set -euo pipefail
PORT=${FLUSHLINE_BENCH_PG_PORT:-54322}
N=${1:-1}
SHAPE=${2:-new}
psql_() { psql -h 127.0.0.1 -p "$PORT" "$@"; }
S=$(psql_ -U postgres flushline_bench -Atc "select o.id from organization o join member m on m.organization_id = o.id join \"user\" u on u.id = m.user_id where u.email = 'owner+s$N@tallowcreek.example'")
# q <query> [a psql line run first in the same transaction, e.g. to \gset the search's ids]
q() {
	psql_ -U flushline_app flushline_bench -q <<SQL
begin;
select set_config('app.store_id', '$S', true) \g /dev/null
${2:-}
explain (analyze) $1 \g /dev/null
explain (analyze, costs off, summary on) $1;
rollback;
SQL
}
# The search function's own query, as its role (flushline_search) runs it; needs the superuser.
qs() {
	psql_ -U postgres flushline_bench -q <<SQL
begin;
set local role flushline_search;
${2:-}
explain (analyze) $1 \g /dev/null
explain (analyze, costs off, summary on) $1;
rollback;
SQL
}
SEL="select j.id, j.number, j.title, j.status, j.customer_id, c.name, c.phone, j.site_id, j.installer_id, i.name, j.salesperson_id, sp.name, j.notes, j.status_changed_at, j.updated_at, j.created_at from job j inner join customer c on c.id = j.customer_id and c.organization_id = j.organization_id left join \"user\" i on i.id = j.installer_id left join \"user\" sp on sp.id = j.salesperson_id"
CNT_JOIN="select count(*) from job j inner join customer c on c.id = j.customer_id and c.organization_id = j.organization_id"
if [ "$SHAPE" = new ]; then
	# Today's (migration 0017): counts stop 1,000 past the page's start; the customer's name is the
	# job's copy of it; a search tests the list's first 2,000 rows in its order, then asks the
	# trigram indexes (`list` in queries/jobs.ts).
	# The customer's phone and the people's names are per-row subqueries (planned in about half
	# the time of the joins). Not searched, a list's total is the store's tally (migration 0020):
	# a first page carries it (`firstpage`), and a page past the middle is read from the end of the
	# order (`fromend`).
	COLS17="select j.id, j.number, j.title, j.status, j.customer_id, j.customer_name, (select c.phone from customer c where c.id = j.customer_id and c.organization_id = j.organization_id), j.site_id, j.installer_id, (select u.name from \"user\" u where u.id = j.installer_id), j.salesperson_id, (select u.name from \"user\" u where u.id = j.salesperson_id), j.notes, j.status_changed_at, j.updated_at, j.created_at"
	# firstpage <where on job> <where on job_tally> <order>
	firstpage() { echo "$COLS17, (select coalesce(sum(t.jobs), 0)::int from job_tally t where $2) from job j where $1 order by $3 limit 50"; }
	# fromend <where> <reversed order> <order> <limit> <offset from the end>
	fromend() { echo "$COLS17 from job j where j.organization_id = '$S' and j.number in (select number from job where $1 order by $2 limit $4 offset $5) order by $3"; }
	SEL17="$COLS17 from job j"
	capped() { echo "select count(*) from (select 1 from job j where $1 limit $(($2 + 1001))) counted"; }
	# window <sort column> <asc|desc> <text>: the page and one more match among the first 2,000 rows.
	window() { echo "$SEL17 where j.organization_id = '$S' and j.id in (select w.id from (select id, title, customer_name, number, $1 as sort_key from job where organization_id = '$S' order by $1 $2, number desc limit 2000) w where (w.title ilike '%$3%' or w.customer_name ilike '%$3%') order by w.sort_key $2, w.number desc limit 51) order by j.$1 $2, j.number desc"; }
	echo "== store $N (new query shape)"
	echo "== list: sold, by updated, with its total from the tally"; q "$(firstpage "organization_id = '$S' and status = 'sold'" "t.organization_id = '$S' and t.status = 'sold'" "updated_at desc, number desc")"
	echo "== list: all, by number, with its total from the tally"; q "$(firstpage "organization_id = '$S'" "t.organization_id = '$S'" "number desc, number desc")"
	echo "== list: all, by customer, with its total from the tally"; q "$(firstpage "organization_id = '$S'" "t.organization_id = '$S'" "customer_name asc, number desc")"
	echo "== list: the tally's total alone (a later page reads it first)"; q "select coalesce(sum(t.jobs), 0)::int from job_tally t where t.organization_id = '$S'"
	TOTAL=$(psql_ -U postgres flushline_bench -Atc "select count(*) from job where organization_id = '$S'")
	LATE=$((TOTAL / 50 - 1))
	SKIP=$(((LATE - 1) * 50))
	FROM_END=$((TOTAL - SKIP - 50 > 0 ? TOTAL - SKIP - 50 : 0))
	echo "== list: all, by number, page $LATE of 50 (the bench's last page but one), read from the end"; q "$(fromend "organization_id = '$S'" "number asc, number asc" "number desc, number desc" 50 $FROM_END)"
	echo "== list: all, by number, page $LATE of 50 skipped to from the start (before migration 0020)"; q "$SEL17 where j.organization_id = '$S' and j.number in (select number from job where organization_id = '$S' order by number desc, number desc limit 50 offset $SKIP) order by j.number desc, j.number desc"
	echo "== count: all, page $LATE of 50, capped (before migration 0020)"; q "$(capped "j.organization_id = '$S'" $SKIP)"
	echo "== search \"oak\", by number: the first 2,000 rows in the list's order hold a page"; q "$(window number desc oak)"
	echo "== search \"orwin\", by number: the same"; q "$(window number desc orwin)"
	echo "== search \"oak\", by customer: the first 2,000 rows in name order (no page there here, so then the function)"; q "$(window customer_name asc oak)"
	fn() { echo "select j.id from public.job j where j.organization_id = '$S' and (j.title ilike '$1' or j.customer_name ilike '$1') limit 1001"; }
	for term in 'otto orwin' oak; do
		echo "== search \"$term\": job_search_ids' own query, as flushline_search"; qs "$(fn "%$term%")"
		echo "== search \"$term\": job_search_ids, as the app calls it"; q "select s.id from job_search_ids('%$term%', 1001) as s(id)"
	done
	IDS="select coalesce(array_agg(s.id), '{}') as ids from job_search_ids('%otto orwin%', 1001) as s(id) \\gset"
	echo "== list: search \"otto orwin\" (399 matches: by id), by number"; q "$SEL17 where j.organization_id = '$S' and j.id = any(:'ids'::text[]) order by j.number desc limit 50" "$IDS"
	by_customer() { echo "select j.id, count(*) over () from public.job j where j.organization_id = '$S' and (j.title ilike '$1' or j.customer_name ilike '$1') order by j.customer_name, j.number desc limit 50"; }
	for term in oak orwin 'otto orwin'; do
		echo "== search \"$term\", by customer: job_search_by_customer's own query, as flushline_search"; qs "$(by_customer "%$term%")" "set local enable_indexscan = off; set local enable_seqscan = off;"
		echo "== search \"$term\", by customer: job_search_by_customer, as the app calls it"; q "select s.id, s.matches from job_search_by_customer('%$term%', false, 50, 0) as s"
	done
	# Migration 0019: sorted by customer, the names holding the text's rarest trigram are walked in
	# name order, each name's jobs read newest first until the page is full.
	for term in oak orwin; do
		T=$(psql_ -U postgres flushline_bench -Atc "select t from unnest(show_trgm('$term')) t where strpos(t, ' ') = 0 order by (select count(*) from job_name_trigram n where n.organization_id = '$S' and n.trigram = t), t limit 1")
		echo "== search \"$term\", by customer: the names holding its rarest trigram \"$T\", in name order (the walk's cursor)"; qs "select n.customer_name from public.job_name_trigram n where n.organization_id = '$S' and n.trigram = '$T' order by n.customer_name limit 10"
		NAME=$(psql_ -U postgres flushline_bench -Atc "select customer_name from job_name_trigram where organization_id = '$S' and trigram = '$T' order by customer_name limit 1")
		echo "== search \"$term\", by customer: the first name's jobs, newest first, until a page and one more match"; qs "select r.id from (select j.id, j.title, j.customer_name from public.job j where j.organization_id = '$S' and j.customer_name = '$NAME' order by j.number desc limit 5000) r where r.title ilike '%$term%' or r.customer_name ilike '%$term%' limit 51" "set local enable_bitmapscan = off;"
		echo "== search \"$term\", by customer: job_search_by_name_walk, as the app calls it"; q "select cardinality(w.ids), w.matches from job_search_by_name_walk('$term', '%$term%', false, 51, 0, 5000) as w"
	done
	echo "== customers: search ash"; q "select * from customer where organization_id = '$S' and (name ilike '%ash%' or email ilike '%ash%' or phone ilike '%ash%') order by name asc, id asc limit 25"
	echo "== customers: count ash"; q "select count(*) from customer where organization_id = '$S' and (name ilike '%ash%' or email ilike '%ash%' or phone ilike '%ash%')"
	exit 0
fi
if [ "$SHAPE" = old ]; then
	CNT="$CNT_JOIN"
	OAK="(j.title ilike '%oak%' or c.name ilike '%oak%')"
	CNT_OAK="$CNT_JOIN"
else
	CNT="select count(*) from job j"
	OAK="(j.title ilike '%oak%' or j.customer_id = any(array(select c2.id from customer c2 where c2.organization_id = '$S' and c2.name ilike '%oak%')))"
	CNT_OAK="$CNT"
fi
echo "== store $N ($SHAPE query shape)"
echo "== list: sold, by updated"; q "$SEL where j.organization_id = '$S' and j.status = 'sold' order by j.updated_at desc, j.number desc limit 50"
echo "== count: sold"; q "$CNT where j.organization_id = '$S' and j.status = 'sold'"
echo "== list: all, by number"; q "$SEL where j.organization_id = '$S' order by j.number desc, j.number desc limit 50"
echo "== count: all"; q "$CNT where j.organization_id = '$S'"
echo "== list: search oak, by customer"; q "$SEL where j.organization_id = '$S' and $OAK order by c.name asc, j.number desc limit 50"
echo "== count: search oak"; q "$CNT_OAK where j.organization_id = '$S' and $OAK"
echo "== customers: search ash"; q "select * from customer where organization_id = '$S' and (name ilike '%ash%' or email ilike '%ash%' or phone ilike '%ash%') order by name asc, id asc limit 25"
I=$(psql_ -U postgres flushline_bench -Atc "select id from \"user\" where email = 'installer+s$N@tallowcreek.example'")
echo "== installer's today: live bookings from today"; q "select b.id, j.id, j.number, j.title, j.status, c.name, s.address, s.town, b.starts_on, b.ends_on, b.days, b.arrives_at from booking b join lateral (select id, organization_id, number, title, status, customer_id, site_id from job where job.id = b.job_id and job.organization_id = b.organization_id and job.installer_id = '$I' limit 1) j on true join customer c on c.id = j.customer_id and c.organization_id = j.organization_id left join site s on s.id = j.site_id and s.organization_id = j.organization_id where b.organization_id = '$S' and b.installer_id = '$I' and b.cancelled_at is null and b.ends_on >= current_date and b.starts_on >= current_date - 59 order by b.starts_on, j.number limit 200"
