#!/usr/bin/env bash
# A deployment needs no dev tools: on a copy of the repository, install everything, `npm run build`, prune
# the dev dependencies (`npm prune --omit=dev`), then seed the demo, back it up and restore it into a fresh
# install, start the server on the restored one and run one analysis through the HTTP API to its result —
# the simulation threads, the seed, backup and restore all run from the JavaScript the build compiled.
# With PostgreSQL binaries present, the same run goes a second time through pg-boss to `npm run worker`.
set -euo pipefail
src="$(cd "$(dirname "$0")/.." && pwd)"
work=$(mktemp -d /tmp/loamwork-production.XXXXXX)
pids=()
cleanup() {
  for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
  wait 2>/dev/null || true
  [ -n "${pg_stop:-}" ] && $pg_stop
  rm -rf "$work"
}
trap cleanup EXIT
free_port() { node -e "const s=require('net').createServer().listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close()})"; }

echo "-- copy of the repository in $work/app"
mkdir -p "$work/app"
(cd "$src" && git ls-files -z --cached --others --exclude-standard | tar --null --ignore-failed-read -T - -cf -) | tar -xf - -C "$work/app"
cd "$work/app"
echo "-- full install and build"
if [ -d "$src/node_modules" ]; then
  # The full install the suite already has, as hard links (the prune below only unlinks in the copy); npm's
  # own record of it is rewritten in place, so that one file is copied.
  cp -al "$src/node_modules" node_modules
  cp --remove-destination "$src/node_modules/.package-lock.json" node_modules/.package-lock.json
else
  npm ci --no-audit --no-fund >"$work/install.log" 2>&1 || { tail -30 "$work/install.log"; exit 1; }
fi
npm run build >"$work/build.log" 2>&1 || { tail -50 "$work/build.log"; exit 1; }
echo "-- prune the dev dependencies"
npm prune --omit=dev --no-audit --no-fund >"$work/prune.log" 2>&1 || { tail -30 "$work/prune.log"; exit 1; }
# npm keeps a dev tool that a production package names as an optional peer ("devOptional" in the lock, e.g.
# typescript and esbuild for the service-worker build's packages). Such a tool is removed here by hand, so the
# server below proves it runs without it; a dev tool that production packages really depend on fails.
for tool in tsx typescript esbuild vitest; do
  [ -e "node_modules/$tool" ] || continue
  if node -e "process.exit(require('./package-lock.json').packages['node_modules/$tool']?.devOptional ? 0 : 1)"; then
    echo "   node_modules/$tool kept by npm only as an optional peer: removed"
    rm -rf "node_modules/$tool"
  else
    echo "node_modules/$tool is still installed after the prune" >&2
    exit 1
  fi
done

export NODE_ENV=production AUTH_SECRET=check-production-secret-0123456789 LOAMWORK_FILES_DIR="$work/files" MAIL_SINK_DIR="$work/mail"

# Starts the server on a free port (as `npm start` does), waits for its health check, runs one analysis.
serve_and_run() {
  local port log
  port=$(free_port)
  log="$work/server-$port.log"
  AUTH_URL="http://localhost:$port" APP_URL="http://localhost:$port" node node_modules/next/dist/bin/next start -H 127.0.0.1 -p "$port" >"$log" 2>&1 &
  pids+=($!)
  for _ in $(seq 1 120); do
    curl -fsS "http://127.0.0.1:$port/api/health" >/dev/null 2>&1 && break
    sleep 0.5
  done
  node scripts/check-production-run.mjs "http://localhost:$port" || { tail -40 "$log"; return 1; }
}

echo "-- embedded database: seed, serve, one run in the server's own simulation threads"
export LOAMWORK_DATA_DIR="$work/pglite"
npm run seed >"$work/seed.log" 2>&1 || { tail -30 "$work/seed.log"; exit 1; }
echo "-- backup of the seeded database and files, restored into a fresh install that the server then runs on"
npm run backup -- "$work/backup.tar.gz" >"$work/backup.log" 2>&1 || { tail -30 "$work/backup.log"; exit 1; }
export LOAMWORK_DATA_DIR="$work/pglite-restored" LOAMWORK_FILES_DIR="$work/files-restored"
npm run restore -- "$work/backup.tar.gz" >"$work/restore.log" 2>&1 || { tail -30 "$work/restore.log"; exit 1; }
serve_and_run
kill "${pids[-1]}"; wait "${pids[-1]}" 2>/dev/null || true; unset 'pids[-1]'
unset LOAMWORK_DATA_DIR
export LOAMWORK_FILES_DIR="$work/files"

bin=$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)
if [ -z "$bin" ] || [ ! -x "$bin/initdb" ]; then
  echo "-- PostgreSQL: skipped, no server binaries"; exit 0
fi
echo "-- PostgreSQL: seed, serve, one run through pg-boss in a worker process"
# As root the server runs as postgres, which must own its folder (outside the private work folder).
as_pg() { if [ "$(id -u)" -eq 0 ]; then (cd / && runuser -u postgres -- "$@"); else "$@"; fi; }
pg=$(mktemp -d /tmp/loamwork-production-pg.XXXXXX)
if [ "$(id -u)" -eq 0 ]; then chown postgres "$pg"; fi
pg_port=$(free_port)
as_pg "$bin/initdb" -D "$pg/data" -U loamwork --auth=trust -E UTF8 >/dev/null
as_pg "$bin/pg_ctl" -D "$pg/data" -l "$pg/log" -o "-p $pg_port -k $pg -c listen_addresses=127.0.0.1 -c fsync=off" -w start >/dev/null
pg_stop="stop_pg"
stop_pg() { as_pg "$bin/pg_ctl" -D "$pg/data" -m fast -w stop >/dev/null 2>&1 || true; rm -rf "$pg"; }
export DATABASE_URL="postgres://loamwork@127.0.0.1:$pg_port/postgres"
npm run seed >"$work/seed-pg.log" 2>&1 || { tail -30 "$work/seed-pg.log"; exit 1; }
echo "-- PostgreSQL: backup through pg_dump, restored into an empty database"
npm run backup -- "$work/backup-pg.tar.gz" >"$work/backup-pg.log" 2>&1 || { tail -30 "$work/backup-pg.log"; exit 1; }
as_pg "$bin/createdb" -h 127.0.0.1 -p "$pg_port" -U loamwork restored
DATABASE_URL="postgres://loamwork@127.0.0.1:$pg_port/restored" LOAMWORK_FILES_DIR="$work/files-restored-pg" \
  npm run restore -- "$work/backup-pg.tar.gz" >"$work/restore-pg.log" 2>&1 || { tail -30 "$work/restore-pg.log"; exit 1; }
npm run worker >"$work/worker.log" 2>&1 &
pids+=($!)
serve_and_run || { tail -30 "$work/worker.log"; exit 1; }
grep -q "run worker ready" "$work/worker.log" || { echo "the run worker did not start" >&2; cat "$work/worker.log"; exit 1; }
echo "-- production build checked"
