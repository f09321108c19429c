#!/usr/bin/env bash
# Brings up (or down) everything Yokeline needs on loopback for one profile.
#   scripts/stack.sh up <profile>     database + migrations + fakes, in the background
#   scripts/stack.sh serve <profile>  up, seed, then the API + built web in the foreground;
#                                     Ctrl-C stops everything it started
#   scripts/stack.sh down <profile>   stops what `up` started (make stop)
# Profiles: dev (make start) and test (make test) never share ports or data.
set -euo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
cd "$here"
cmd=${1:?up|serve|down}
profile=${2:-dev}

case $profile in
  dev)   : "${PGPORT:=55432}" "${PORT:=3000}" "${SMTP_PORT:=2525}" "${S3_PORT:=4569}" ;;
  test)  : "${PGPORT:=55433}" "${PORT:=3100}" "${SMTP_PORT:=2625}" "${S3_PORT:=4669}" ;;
  bench) : "${PGPORT:=55434}" "${PORT:=3200}" "${SMTP_PORT:=2725}" "${S3_PORT:=4769}" ;;
  *) # Any other name is a private stack: all four ports must be given.
     : "${PGPORT:?set PGPORT for profile $profile}" "${PORT:?set PORT}" "${SMTP_PORT:?set SMTP_PORT}" "${S3_PORT:?set S3_PORT}" ;;
esac
export PGPORT PORT SMTP_PORT S3_PORT
export SMTP_HTTP_PORT=$((SMTP_PORT + 1))
export DATABASE_URL=${DATABASE_URL:-postgres://postgres@127.0.0.1:$PGPORT/yokeline}
export MAIL_CAPTURE_URL=${MAIL_CAPTURE_URL:-http://127.0.0.1:$SMTP_HTTP_PORT}
export S3_ENDPOINT=${S3_ENDPOINT:-http://127.0.0.1:$S3_PORT}
export S3_DATA_DIR=${S3_DATA_DIR:-$here/uploads-fake/data/$profile}
export PUBLIC_URL=${PUBLIC_URL:-http://127.0.0.1:$PORT}
export AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true
run=$here/.data/run/$profile
mkdir -p "$run"

start_bg() { # name, command...
  local name=$1; shift
  if [ -f "$run/$name.pid" ] && kill -0 "$(cat "$run/$name.pid")" 2>/dev/null; then return 0; fi
  setsid "$@" >"$run/$name.log" 2>&1 &
  echo $! >"$run/$name.pid"
}
stop_bg() {
  local name=$1
  if [ -f "$run/$name.pid" ]; then
    local pid; pid=$(cat "$run/$name.pid")
    kill -TERM -- "-$pid" 2>/dev/null || kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 30); do kill -0 "$pid" 2>/dev/null || break; sleep 0.1; done
    kill -KILL -- "-$pid" 2>/dev/null || true
    rm -f "$run/$name.pid"
  fi
}
wait_port() { # port, name
  for _ in $(seq 1 100); do
    (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null && return 0
    sleep 0.1
  done
  echo "$2 did not start on port $1; see $run/$2.log" >&2
  cat "$run/$2.log" >&2 || true
  return 1
}

up() {
  scripts/pg.sh start "$profile"
  node dist/server/src-api/db/migrate.js
  start_bg smtp node dist/server/scripts/fakes/smtp-capture.js
  start_bg s3 node dist/server/uploads-fake/server.js
  wait_port "$SMTP_PORT" smtp
  wait_port "$S3_PORT" s3
}

# A private stack's API in the background (for helpers and scripts): scripts/stack.sh api <profile>
api_bg() {
  stop_bg api
  node dist/server/src-api/seed/seed.js >/dev/null
  start_bg api env NODE_ENV=development LOG_LEVEL=${LOG_LEVEL:-warn} node dist/server/src-api/main.js
  wait_port "$PORT" api
  echo "API + web on http://127.0.0.1:$PORT (log: $run/api.log)"
}

down() {
  stop_bg api
  stop_bg smtp
  stop_bg s3
  scripts/pg.sh stop "$profile"
}

case $cmd in
  up) up ;;
  api) up; api_bg ;;
  down) down; echo "Stopped the $profile stack." ;;
  serve)
    trap 'echo; echo "Stopping…"; down; exit 0' INT TERM
    up
    node dist/server/src-api/seed/seed.js
    cat <<MSG

  Yokeline is running at  http://127.0.0.1:$PORT
  Demo accounts (password: yokeline-demo — for the demo only):
    inspector@harrowgate.test   receiving inspector
    engineer@harrowgate.test    quality engineer
    auditor@harrowgate.test     auditor (read-only)
    admin@harrowgate.test       administrator
    quality@northgate-lamination.test, quality@selby-pressworks.test,
    quality@okaro-stamping.test supplier users
  Captured e-mail: http://127.0.0.1:$PORT/dev/mailbox      Ctrl-C stops everything.

MSG
    NODE_ENV=development node dist/server/src-api/main.js &
    api=$!
    echo $api >"$run/api.pid"
    wait $api || true
    down
    ;;
  env)
    # For scripts that want the profile's addresses: eval "$(scripts/stack.sh env test)"
    for v in PGPORT PORT SMTP_PORT SMTP_HTTP_PORT S3_PORT DATABASE_URL MAIL_CAPTURE_URL S3_ENDPOINT S3_DATA_DIR PUBLIC_URL; do
      printf 'export %s=%q\n' "$v" "${!v}"
    done
    ;;
  *) echo "unknown command $cmd" >&2; exit 2 ;;
esac
