#!/usr/bin/env bash
# The whole test suite (`npm test`): system packages, lint (the import boundaries included), types, units and
# integration on PGlite, the same integration suite on a real PostgreSQL server, a production build, browser
# tests in Debian's chromium, and a pruned production install running one analysis (scripts/check-production.sh).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-system.sh
echo "== lint"; npx eslint --max-warnings 0 .
echo "== format"; npx prettier --check . > /dev/null || { npx prettier --list-different .; echo "Run npm run format."; exit 1; }
echo "== types"; npx tsc --noEmit -p .
echo "== index access"; node scripts/check-index-access.mjs
echo "== units and integration (PGlite)"; npx vitest run
echo "== integration (PostgreSQL)"; bash scripts/with-postgres.sh npx vitest run tests/integration
echo "== build"; rm -rf .next dist && npm run build >/tmp/loamwork-build.log 2>&1 || { tail -50 /tmp/loamwork-build.log; exit 1; }
echo "== browser"; npx vitest run -c vitest.e2e.config.ts
echo "== production without dev tools"; bash scripts/check-production.sh
