#!/usr/bin/env bash
# npm run restore: restores a backup made by `npm run backup` (pg_dump custom format) into a database.
#
#   npm run restore -- FILE                          into a fresh database crankjournal_restored_<timestamp>
#   npm run restore -- FILE --database NAME          into NAME, which must not exist yet
#   npm run restore -- FILE --database NAME --force  replaces NAME (even the live one) — the backup is first
#                                                    restored beside it, and NAME is swapped only once that worked
#   --database-url URL                               the cluster (and the role that will own the database), given as
#                                                    the URL of any database on it; default the demo cluster
#                                                    (127.0.0.1:55432, role crankjournal), started if not running
#
# It never writes over an existing database without --force. The last line printed is the database name.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

PG_PORT="${PG_PORT:-55432}"
FILE=""
TARGET=""
FORCE=0
URL=""
usage() { sed -n '2,12p' "${BASH_SOURCE[0]}" | sed 's/^# \{0,1\}//'; }
while [ $# -gt 0 ]; do
  case "$1" in
    --database) TARGET="${2:?--database needs a name}"; shift 2 ;;
    --database-url) URL="${2:?--database-url needs a URL}"; shift 2 ;;
    --force) FORCE=1; shift ;;
    -h|--help) usage; exit 0 ;;
    -*) say "unknown option: $1"; usage; exit 2 ;;
    *) if [ -n "$FILE" ]; then say "one backup file at a time ($FILE, $1)"; exit 2; fi; FILE="$1"; shift ;;
  esac
done
if [ -z "$FILE" ]; then say "name the backup file to restore"; usage; exit 2; fi
if [ ! -f "$FILE" ]; then say "no such backup file: $FILE"; exit 2; fi
if [ -z "$TARGET" ]; then TARGET="crankjournal_restored_$(date -u +%Y%m%d_%H%M%S)"; fi
if ! [[ "$TARGET" =~ ^[a-z_][a-z0-9_]{0,50}$ ]]; then say "database names here are lower-case letters, digits and _ (at most 51): $TARGET"; exit 2; fi

WORK=""
cleanup() {
  if [ -n "$WORK" ]; then admin -c "DROP DATABASE IF EXISTS $WORK WITH (FORCE)" >/dev/null 2>&1 || true; fi
  pg_down
}
trap cleanup EXIT
ensure_postgres
if [ -z "$URL" ]; then
  pg_up demo "$PG_PORT"
  URL="$(db_url "$PG_PORT" crankjournal)"
fi
# Host, port and owning role from the URL; the databases themselves are created and swapped by the superuser.
read -r HOST PORT OWNER OWNER_PASSWORD < <(node -e 'const u = new URL(process.argv[1]); console.log(u.hostname, u.port || 5432, decodeURIComponent(u.username), decodeURIComponent(u.password) || "-")' "$URL")
# The superuser's password: PGPASSWORD if given, else the private cluster's generated one.
ADMIN_PASSWORD="${PGPASSWORD:-$(cat "$ROOT/.data/pg-superuser-password" 2>/dev/null || true)}"
admin() { PGPASSWORD="$ADMIN_PASSWORD" PGOPTIONS='-c client_min_messages=warning' "$PG_BIN/psql" -h "$HOST" -p "$PORT" -U postgres -d postgres -v ON_ERROR_STOP=1 -qtA "$@"; }
exists() { [ -n "$(admin -c "SELECT 1 FROM pg_database WHERE datname = '$1'")" ]; }
"$PG_BIN/pg_restore" --list "$FILE" >/dev/null || { say "$FILE is not a backup pg_restore can read"; exit 1; }

if exists "$TARGET" && [ "$FORCE" != 1 ]; then
  say "database $TARGET already exists: nothing was changed. To replace it, add --force (or name a new database with --database)."
  exit 3
fi

# Restored first into a database of its own, so a failed restore leaves the target as it was.
WORK="${TARGET:0:40}_restoring_$$"
admin -c "DROP DATABASE IF EXISTS $WORK WITH (FORCE)" -c "CREATE DATABASE $WORK OWNER \"$OWNER\"" >/dev/null
say "restoring $FILE into $TARGET"
PGPASSWORD="${OWNER_PASSWORD#-}" "$PG_BIN/pg_restore" --exit-on-error --no-owner --no-privileges \
  -h "$HOST" -p "$PORT" -U "$OWNER" -d "$WORK" "$FILE"

if exists "$TARGET"; then
  say "replacing database $TARGET (--force): its connections are closed"
  admin -c "DROP DATABASE $TARGET WITH (FORCE)" >/dev/null
fi
admin -c "ALTER DATABASE $WORK RENAME TO $TARGET" >/dev/null
WORK=""
say "restored into database $TARGET on $HOST:$PORT"
echo "$TARGET"
