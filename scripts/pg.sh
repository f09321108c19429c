#!/usr/bin/env bash
# Start / stop a throwaway PostgreSQL cluster on 127.0.0.1 in a project-local folder.
# usage: scripts/pg.sh start|stop|status <profile>   (profile: dev | test | bench)
# env:   PGPORT (port), YOKELINE_DATA (data root; default .data under the checkout)
set -euo pipefail
cmd=${1:?start|stop|status}
profile=${2:-dev}
here=$(cd "$(dirname "$0")/.." && pwd)
PGBIN=${PGBIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1 || true)}
[ -x "$PGBIN/pg_ctl" ] || { echo "PostgreSQL server binaries not found (run scripts/ensure-deps.sh)" >&2; exit 1; }
port=${PGPORT:?PGPORT must be set}

# The cluster folder must be reachable by the postgres user. A checkout under a private folder
# (mktemp -d is mode 700) is not, so fall back to a folder under the system temp dir keyed by
# a hash of the checkout path.
root=${YOKELINE_DATA:-$here/.data}
if ! runuser -u postgres -- test -x "$here" 2>/dev/null; then
  root=/tmp/yokeline-$(printf '%s' "$here" | sha1sum | cut -c1-12)
fi
dir=$root/$profile
data=$dir/pg
sock=$dir/sock
as_pg() { (cd "$dir" && runuser -u postgres -- "$@"); }

case $cmd in
  start)
    mkdir -p "$dir"
    chown postgres:postgres "$root" "$dir" 2>/dev/null || true
    chmod 700 "$dir"
    if [ ! -s "$data/PG_VERSION" ]; then
      as_pg mkdir -p "$data" "$sock"
      as_pg "$PGBIN/initdb" -D "$data" --no-sync --auth=trust -U postgres --encoding=UTF8 \
        --locale=C.UTF-8 >"$dir/initdb.log" 2>&1 || { cat "$dir/initdb.log" >&2; exit 1; }
    fi
    as_pg mkdir -p "$sock"
    if as_pg "$PGBIN/pg_ctl" -D "$data" status >/dev/null 2>&1; then
      echo "PostgreSQL ($profile) already running on 127.0.0.1:$port"
      exit 0
    fi
    opts="-c listen_addresses=127.0.0.1 -p $port -k $sock -c max_connections=200"
    if [ "$profile" != dev ]; then
      opts="$opts -c fsync=off -c synchronous_commit=off -c full_page_writes=off"
    fi
    as_pg "$PGBIN/pg_ctl" -D "$data" -l "$dir/postgres.log" -o "$opts" -w -t 30 start >/dev/null
    for _ in $(seq 1 50); do
      "$PGBIN/pg_isready" -h 127.0.0.1 -p "$port" -q && break
      sleep 0.1
    done
    echo "PostgreSQL ($profile) running on 127.0.0.1:$port, data in $data"
    ;;
  stop)
    if [ -s "$data/PG_VERSION" ]; then
      as_pg "$PGBIN/pg_ctl" -D "$data" -m fast -w stop >/dev/null 2>&1 || true
    fi
    ;;
  restart)
    as_pg "$PGBIN/pg_ctl" -D "$data" -m fast -w restart >/dev/null
    ;;
  status)
    as_pg "$PGBIN/pg_ctl" -D "$data" status
    ;;
  path)
    echo "$dir"
    ;;
  destroy)
    "$0" stop "$profile"
    rm -rf "$data"
    ;;
  *) echo "unknown command $cmd" >&2; exit 2 ;;
esac
