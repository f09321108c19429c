#!/usr/bin/env bash
# make backup / make restore FILE=…: the database (pg_dump, custom format) and the object
# storage (a tar of the fake's data folder, with a SHA-256 manifest), in one timestamped folder.
#   scripts/backup.sh backup  <profile> [dest-root]     → prints the backup folder
#   scripts/backup.sh restore <profile> <backup-folder> [database-name]
set -euo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
cd "$here"
cmd=${1:?backup|restore}
profile=${2:-dev}
eval "$(scripts/stack.sh env "$profile")"
PGBIN=${PGBIN:-$(ls -d /usr/lib/postgresql/*/bin 2>/dev/null | sort -V | tail -n 1)}
db=$(basename "${DATABASE_URL%%\?*}")
pgopts=(-h 127.0.0.1 -p "$PGPORT" -U postgres)

manifest() { # folder → "sha256  relative-path" lines, sorted
  (cd "$1" && find . -type f -print0 | sort -z | xargs -0 -r sha256sum)
}

case $cmd in
  backup)
    root=${3:-$here/backups}
    dest=$root/$(date -u +%Y%m%dT%H%M%SZ)-$profile
    mkdir -p "$dest"
    "$PGBIN/pg_dump" "${pgopts[@]}" -Fc -d "$db" -f "$dest/db.dump"
    mkdir -p "$S3_DATA_DIR"
    tar -C "$S3_DATA_DIR" -cf "$dest/objects.tar" .
    manifest "$S3_DATA_DIR" >"$dest/objects.sha256"
    printf 'profile=%s\ndatabase=%s\ncreated=%s\n' "$profile" "$db" "$(date -u +%FT%TZ)" >"$dest/backup.info"
    echo "$dest"
    ;;
  restore)
    src=${3:?give the backup folder: make restore FILE=backups/<folder>}
    target=${4:-$db}
    [ -f "$src/db.dump" ] && [ -f "$src/objects.tar" ] || { echo "$src is not a Yokeline backup" >&2; exit 1; }
    psql -q "${pgopts[@]}" -d postgres -c "drop database if exists \"$target\" with (force)" -c "create database \"$target\""
    "$PGBIN/pg_restore" "${pgopts[@]}" -d "$target" --no-owner "$src/db.dump"
    objects=${RESTORE_OBJECTS_DIR:-$S3_DATA_DIR}
    rm -rf "$objects" && mkdir -p "$objects"
    tar -C "$objects" -xf "$src/objects.tar"
    if ! diff -q <(manifest "$objects") "$src/objects.sha256" >/dev/null; then
      echo "restored objects do not match the backup's manifest" >&2
      exit 1
    fi
    echo "Restored $src into database $target and $objects"
    ;;
  *) echo "unknown command $cmd" >&2; exit 2 ;;
esac
