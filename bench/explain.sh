#!/usr/bin/env bash
# EXPLAIN ANALYZE of the job list and customer search queries (as the API sends them, through
# row-level security as the app's role) on the scale seed, each run once to warm the session's
# caches and then shown. Usage: bash bench/explain.sh [store number, default 1]
# (FLUSHLINE_BENCH_PG_PORT names the bench cluster's port, default 54322.)
set -euo pipefail
PORT=${FLUSHLINE_BENCH_PG_PORT:-54322}
N=${1:-1}
psql_() { psql -h 127.0.0.1 -p "$PORT" "$@"; }
S=$(psql_ -U postgres flushline_bench -Atc "select o.id from organization o join member m on m.organization_id = o.id join \"user\" u on u.id = m.user_id where u.email = 'owner+s$N@tallowcreek.example'")
q() {
	psql_ -U flushline_app flushline_bench -q <<SQL
begin;
select set_config('app.store_id', '$S', true) \g /dev/null
explain (analyze) $1 \g /dev/null
explain (analyze, costs off, summary on) $1;
rollback;
SQL
}
SEL="select j.id, j.number, j.title, j.status, j.customer_id, c.name, c.phone, j.site_id, j.installer_id, i.name, j.salesperson_id, sp.name, j.notes, j.status_changed_at, j.updated_at, j.created_at from job j inner join customer c on c.id = j.customer_id and c.organization_id = j.organization_id left join \"user\" i on i.id = j.installer_id left join \"user\" sp on sp.id = j.salesperson_id"
CNT_JOIN="select count(*) from job j inner join customer c on c.id = j.customer_id and c.organization_id = j.organization_id"
CNT="select count(*) from job j"
OAK="(j.title ilike '%oak%' or c.name ilike '%oak%')"
echo "== list: sold, by updated"; q "$SEL where j.organization_id = '$S' and j.status = 'sold' order by j.updated_at desc, j.number desc limit 50"
echo "== count: sold"; q "${COUNT_SHAPE:-$CNT} where j.organization_id = '$S' and j.status = 'sold'"
echo "== list: all, by number"; q "$SEL where j.organization_id = '$S' order by j.number desc, j.number desc limit 50"
echo "== count: all"; q "${COUNT_SHAPE:-$CNT} where j.organization_id = '$S'"
echo "== list: search oak, by customer"; q "$SEL where j.organization_id = '$S' and $OAK order by c.name asc, j.number desc limit 50"
echo "== count: search oak"; q "$CNT_JOIN where j.organization_id = '$S' and $OAK"
echo "== customers: search ash"; q "select * from customer where organization_id = '$S' and (name ilike '%ash%' or email ilike '%ash%' or phone ilike '%ash%') order by name asc, id asc limit 25"
