#!/usr/bin/env bash
# Install what is missing on a fresh Debian machine: PostgreSQL (server), optionally Chromium,
# and node_modules when absent or older than package-lock.json.
# usage: scripts/ensure-deps.sh [--browser]
set -euo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
cd "$here"
want_browser=0
[ "${1:-}" = "--browser" ] && want_browser=1

need=()
ls /usr/lib/postgresql/*/bin/pg_ctl >/dev/null 2>&1 || need+=(postgresql)
if [ $want_browser = 1 ] && [ ! -x /usr/bin/chromium ]; then need+=(chromium); fi
if [ ${#need[@]} -gt 0 ]; then
  echo "Installing from Debian: ${need[*]}"
  if [ "$(id -u)" != 0 ]; then echo "need root to apt-get install ${need[*]}" >&2; exit 1; fi
  # Debian's postgresql package would otherwise create and start a system cluster we do not use.
  mkdir -p /etc/postgresql-common
  grep -qs '^create_main_cluster' /etc/postgresql-common/createcluster.conf ||
    echo 'create_main_cluster = false' >> /etc/postgresql-common/createcluster.conf
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi

stamp=node_modules/.yokeline-lock.sha1
want=$(sha1sum package-lock.json | cut -d' ' -f1)
if [ ! -d node_modules ] || [ "$(cat "$stamp" 2>/dev/null)" != "$want" ]; then
  echo "Installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi
