#!/usr/bin/env bash
# Shared set-up for ops/start.sh and ops/test.sh: installs what is missing, runs a private
# PostgreSQL cluster on 127.0.0.1 and the local stand-ins for hosted services.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1
CHILD_PIDS=()

say() { printf '\033[1;33m[crankjournal]\033[0m %s\n' "$*"; }
as_root() { if [ "$(id -u)" = 0 ]; then "$@"; else sudo "$@"; fi; }

apt_install() {
  say "installing Debian packages: $*"
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y --no-install-recommends "$@" >/dev/null 2>&1 || {
    as_root env DEBIAN_FRONTEND=noninteractive apt-get update >/dev/null 2>&1
    as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y --no-install-recommends "$@" >/dev/null
  }
}

ensure_postgres() {
  if ! ls /usr/lib/postgresql/*/bin/initdb >/dev/null 2>&1; then apt_install postgresql; fi
  PG_BIN="$(ls -d /usr/lib/postgresql/*/bin | sort -V | tail -n 1)"
  export PG_BIN
}

ensure_chromium() {
  if [ ! -x /usr/bin/chromium ]; then apt_install chromium; fi
}

# pdffonts, pdftotext, pdfinfo and pdftoppm: the printed-record tests check every PDF with them.
ensure_poppler() {
  if ! command -v pdffonts >/dev/null || ! command -v pdftoppm >/dev/null; then apt_install poppler-utils; fi
}

# npm packages from the lock file; reinstalled when the lock file changes.
ensure_node_modules() {
  local stamp="$ROOT/node_modules/.crankjournal-lock.sha"
  local want; want="$(sha256sum "$ROOT/package-lock.json" | cut -d' ' -f1)"
  if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
    say "installing npm packages from package-lock.json (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
    echo "$want" > "$stamp"
  fi
}

# Builds shared-types and the service always (fast), the UI only when its sources changed.
build_all() {
  say "building shared-types and service"
  (cd "$ROOT" && npm run build -w shared-types --silent && npm run build -w service --silent)
  local ui_stamp="$ROOT/ui/dist/.built"
  if [ ! -f "$ui_stamp" ] || [ -n "$(find "$ROOT/ui/src" "$ROOT/ui/index.html" "$ROOT/ui/vite.config.ts" "$ROOT/shared-types/src" -newer "$ui_stamp" -type f 2>/dev/null | head -n 1)" ]; then
    say "building the UI"
    (cd "$ROOT" && npm run build -w ui --silent)
    touch "$ui_stamp"
  fi
}

# Where a cluster's data lives. PostgreSQL refuses to run as root, so as root the data belongs to the
# `postgres` user; if that user cannot enter this checkout, the data goes under /var/tmp instead,
# named after this checkout, with a link from .data/ so it is easy to find.
pg_data_dir() {
  local name="$1"
  local local_dir="$ROOT/.data/pg-$name"
  if [ "$(id -u)" != 0 ]; then echo "$local_dir"; return; fi
  if runuser -u postgres -- test -x "$ROOT/.data" 2>/dev/null || { mkdir -p "$ROOT/.data" && runuser -u postgres -- test -x "$ROOT/.data" 2>/dev/null; }; then
    echo "$local_dir"
  else
    local id; id="$(printf '%s' "$ROOT" | sha256sum | cut -c1-12)"
    echo "/var/tmp/crankjournal-$id/pg-$name"
  fi
}

pg_run() { if [ "$(id -u)" = 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi; }

# pg_up NAME PORT: create (first time) and start a private cluster on 127.0.0.1:PORT.
pg_up() {
  local name="$1" port="$2"
  ensure_postgres
  PGDATA_DIR="$(pg_data_dir "$name")"
  mkdir -p "$ROOT/.data"
  if [ ! -f "$PGDATA_DIR/PG_VERSION" ]; then
    say "creating a private PostgreSQL cluster in $PGDATA_DIR"
    mkdir -p "$PGDATA_DIR"
    if [ "$(id -u)" = 0 ]; then chown -R postgres:postgres "$(dirname "$PGDATA_DIR")"; chmod 711 "$(dirname "$PGDATA_DIR")"; fi
    chmod 700 "$PGDATA_DIR"
    pg_run "$PG_BIN/initdb" -D "$PGDATA_DIR" -U postgres --auth-local=trust --auth-host=trust -E UTF8 --no-locale >/dev/null
    case "$PGDATA_DIR" in "$ROOT"/*) ;; *) ln -sfn "$PGDATA_DIR" "$ROOT/.data/pg-$name" ;; esac
  fi
  if ! pg_run "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1; then
    say "starting PostgreSQL on 127.0.0.1:$port"
    pg_run "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" -l "$PGDATA_DIR/server.log" -w -t 60 \
      -o "-p $port -k /tmp -c listen_addresses=127.0.0.1 -c fsync=${PG_FSYNC:-on} -c max_connections=200" start >/dev/null
    PG_STARTED_BY_US="$PGDATA_DIR"
  fi
}

pg_down() {
  if [ -n "${PG_STARTED_BY_US:-}" ]; then
    pg_run "$PG_BIN/pg_ctl" -D "$PG_STARTED_BY_US" -m fast -w stop >/dev/null 2>&1 || true
    PG_STARTED_BY_US=""
  fi
}

# pg_database PORT DB [fresh]: make sure role crankjournal owns database DB (dropped first when fresh).
pg_database() {
  local port="$1" db="$2" fresh="${3:-}"
  local psql=("$PG_BIN/psql" -h 127.0.0.1 -p "$port" -U postgres -d postgres -v ON_ERROR_STOP=1 -qtA)
  "${psql[@]}" -c "DO \$\$BEGIN IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname='crankjournal') THEN CREATE ROLE crankjournal LOGIN PASSWORD 'crankjournal'; END IF; END\$\$;" >/dev/null
  if [ "$fresh" = fresh ]; then "${psql[@]}" -c "DROP DATABASE IF EXISTS $db WITH (FORCE)" >/dev/null; fi
  if [ -z "$("${psql[@]}" -c "SELECT 1 FROM pg_database WHERE datname='$db'")" ]; then
    "${psql[@]}" -c "CREATE DATABASE $db OWNER crankjournal" >/dev/null
  fi
}

# start_standins SMTP_PORT MAIL_HTTP_PORT S3_PORT DATA_DIR
start_standins() {
  local smtp="$1" mailhttp="$2" s3="$3" dir="$4"
  node "$ROOT/ops/standins/mail-inbox.mjs" --smtp-port "$smtp" --http-port "$mailhttp" --dir "$dir/mail" &
  CHILD_PIDS+=($!)
  node "$ROOT/ops/standins/object-store.mjs" --port "$s3" --dir "$dir/objects" &
  CHILD_PIDS+=($!)
  wait_for_port "$smtp" "mail inbox"
  wait_for_port "$s3" "object store"
}

wait_for_port() {
  local port="$1" what="$2"
  for _ in $(seq 1 150); do
    if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then return 0; fi
    sleep 0.2
  done
  say "$what did not open port $port"; return 1
}

port_free() { ! (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null; }

stop_children() {
  for pid in "${CHILD_PIDS[@]:-}"; do
    [ -n "$pid" ] && kill "$pid" 2>/dev/null || true
  done
  for pid in "${CHILD_PIDS[@]:-}"; do
    [ -n "$pid" ] && wait "$pid" 2>/dev/null || true
  done
  CHILD_PIDS=()
}
