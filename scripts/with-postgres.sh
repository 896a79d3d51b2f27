#!/usr/bin/env bash
# Runs a command beside a throwaway PostgreSQL server on a loopback port, with LOAMWORK_TEST_PG pointing at it.
set -euo pipefail
bin=$(dirname "$(ls /usr/lib/postgresql/*/bin/initdb | sort -V | tail -n 1)")
port=${LOAMWORK_TEST_PG_PORT:-55432}
dir=$(mktemp -d /tmp/loamwork-pg.XXXXXX)
as_pg() { if [ "$(id -u)" -eq 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }
[ "$(id -u)" -eq 0 ] && chown postgres "$dir"
as_pg "$bin/initdb" -D "$dir/data" -U loamwork --auth=trust -E UTF8 >/dev/null
as_pg "$bin/pg_ctl" -D "$dir/data" -l "$dir/log" -o "-p $port -k $dir -c listen_addresses=127.0.0.1 -c fsync=off -c max_connections=300" -w start >/dev/null
cleanup() { as_pg "$bin/pg_ctl" -D "$dir/data" -m fast -w stop >/dev/null 2>&1 || true; rm -rf "$dir"; }
trap cleanup EXIT
export LOAMWORK_TEST_PG="postgres://loamwork@127.0.0.1:$port/postgres"
export LOAMWORK_PG_BIN="$bin"
"$@"
