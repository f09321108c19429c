#!/usr/bin/env bash
# Everything make test runs, after the install and build steps: the test stack on its own ports
# and data folder, lint, type-check, then unit, API and browser tests. Ends with `N passed, N failed`.
set -uo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
cd "$here"
eval "$(scripts/stack.sh env test)"
export E2E_BASE_URL=http://127.0.0.1:$PORT
out=$here/tests/artifacts
mkdir -p "$out"
checks=$out/checks.txt
: >"$checks"
started=$(date +%s)

cleanup() { scripts/stack.sh down test >/dev/null 2>&1 || true; }
trap cleanup EXIT

scripts/stack.sh up test || { echo "0 passed, 1 failed"; exit 1; }

# The browser tests run against the real server and built web app over a freshly seeded database.
e2e_db=postgres://postgres@127.0.0.1:$PGPORT/yokeline_e2e
psql -q -h 127.0.0.1 -p "$PGPORT" -U postgres -d postgres -c 'drop database if exists yokeline_e2e with (force)' >/dev/null
DATABASE_URL=$e2e_db node dist/server/src-api/db/migrate.js >/dev/null
DATABASE_URL=$e2e_db node dist/server/src-api/seed/seed.js >/dev/null
DATABASE_URL=$e2e_db LOG_LEVEL=warn NODE_ENV=test WORKERS=true LOGIN_RATE_PER_MINUTE=600 setsid node dist/server/src-api/main.js >"$out/e2e-server.log" 2>&1 &
echo $! >"$here/.data/run/test/api.pid"
for _ in $(seq 1 100); do curl -fs "$E2E_BASE_URL/api/health" >/dev/null 2>&1 && break; sleep 0.1; done

step() { # name, command...
  local name=$1; shift
  echo "── $name"
  if "$@"; then echo "$name pass" >>"$checks"; else echo "$name fail" >>"$checks"; fi
}
step lint npx eslint . --max-warnings=0
step typecheck-api npx tsc -p tsconfig.json
step typecheck-web npx tsc -p src-web/tsconfig.json

echo "── tests (unit, api, e2e)"
npx vitest run --reporter=default --reporter=json --outputFile.json="$out/vitest.json"

echo "── took $(( $(date +%s) - started )) s"
node dist/server/scripts/summarize.js "$out/vitest.json" "$checks"
