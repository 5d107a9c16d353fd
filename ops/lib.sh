#!/usr/bin/env bash
# Shared set-up for ops/start.sh and ops/test.sh: installs what is missing, runs a private
# PostgreSQL cluster on 127.0.0.1 and the local stand-ins for hosted services.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD=1
CHILD_PIDS=()
# How the service's Node.js runs: V8 would let the heap grow to three or four times what it holds before collecting
# (a million-row CSV import reached 540 MB); capped, the process stays under 300 MB at the same speed.
SERVICE_NODE_FLAGS=(--max-old-space-size=224)

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
    if [ "$(id -u)" = 0 ]; then chown -R postgres:postgres "$PGDATA_DIR"; chmod 711 "$(dirname "$PGDATA_DIR")"; fi
    chmod 700 "$PGDATA_DIR"
    # Peer authentication on the socket, passwords (scram-sha-256) over TCP; the superuser's password is
    # generated once and kept in .data/ (0600). initdb reads it from a file only the cluster's owner can read.
    local pwfile="$PGDATA_DIR.pwfile"
    (umask 077; secret_file pg-superuser-password > "$pwfile")
    if [ "$(id -u)" = 0 ]; then chown postgres "$pwfile"; fi
    pg_run "$PG_BIN/initdb" -D "$PGDATA_DIR" -U postgres --auth-local=peer --auth-host=scram-sha-256 --pwfile="$pwfile" \
      -E UTF8 --no-locale >/dev/null
    rm -f "$pwfile"
    case "$PGDATA_DIR" in "$ROOT"/*) ;; *) ln -sfn "$PGDATA_DIR" "$ROOT/.data/pg-$name" ;; esac
  fi
  # The socket lives in a directory of the cluster's own (0700), not in a world-writable /tmp.
  local sockets="$PGDATA_DIR/sockets"
  if ! pg_run "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" status >/dev/null 2>&1; then
    say "starting PostgreSQL on 127.0.0.1:$port"
    pg_run mkdir -p "$sockets"
    pg_run chmod 700 "$sockets"
    pg_run "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" -l "$PGDATA_DIR/server.log" -w -t 60 \
      -o "-p $port -k $sockets -c listen_addresses=127.0.0.1 -c fsync=${PG_FSYNC:-on} -c max_connections=200" start >/dev/null
    PG_STARTED_BY_US="$PGDATA_DIR"
  fi
  pg_harden "$port"
}

# A cluster made before passwords were asked for (trust in pg_hba.conf): the superuser gets the generated
# password, then the same rules as a new cluster (peer on the socket, scram-sha-256 over TCP) are loaded.
pg_harden() {
  local port="$1" hba="$PGDATA_DIR/pg_hba.conf"
  if ! pg_run grep -qE '^[^#]*[[:space:]]trust([[:space:]]|$)' "$hba"; then return 0; fi
  say "asking for passwords on the cluster in $PGDATA_DIR (it trusted every local user)"
  PGPASSWORD="" "$PG_BIN/psql" -h 127.0.0.1 -p "$port" -U postgres -d postgres -v ON_ERROR_STOP=1 -qtA \
    -c "SET password_encryption = 'scram-sha-256'" -c "ALTER ROLE postgres PASSWORD '$(secret_file pg-superuser-password)'" >/dev/null
  pg_run sed -i -E -e 's/^(local[[:space:]].*[[:space:]])trust([[:space:]]*)$/\1peer\2/' \
    -e 's/^(host[[:space:]].*[[:space:]])trust([[:space:]]*)$/\1scram-sha-256\2/' "$hba"
  pg_run "$PG_BIN/pg_ctl" -D "$PGDATA_DIR" reload >/dev/null
}

# .data/ holds secrets: readable by its owner only. As root the cluster's data may live inside it and belongs
# to `postgres`, which must then be able to pass through (0711: enter, not list).
secure_data_dir() {
  mkdir -p "$ROOT/.data"
  if [ "$(id -u)" = 0 ] && ls -d "$ROOT"/.data/pg-* >/dev/null 2>&1; then chmod 711 "$ROOT/.data"; else chmod 700 "$ROOT/.data"; fi
}

# secret_file NAME: prints the secret kept in .data/NAME (0600), generating it (32 random hex characters) the first time.
secret_file() {
  local file="$ROOT/.data/$1"
  secure_data_dir
  if [ ! -s "$file" ]; then (umask 077; head -c 16 /dev/urandom | od -An -tx1 | tr -d ' \n' > "$file.tmp" && mv "$file.tmp" "$file"); fi
  chmod 600 "$file"
  cat "$file"
}

# pg_admin PORT [psql arguments]: psql as the cluster's superuser over TCP, with the generated password.
pg_admin() {
  local port="$1"; shift
  PGPASSWORD="$(secret_file pg-superuser-password)" "$PG_BIN/psql" -h 127.0.0.1 -p "$port" -U postgres -d postgres -v ON_ERROR_STOP=1 -qtA "$@"
}

# db_url PORT DB: the service's DATABASE_URL for database DB of the private cluster (role crankjournal, its generated password).
db_url() { echo "postgres://crankjournal:$(secret_file pg-crankjournal-password)@127.0.0.1:$1/$2"; }

pg_down() {
  if [ -n "${PG_STARTED_BY_US:-}" ]; then
    pg_run "$PG_BIN/pg_ctl" -D "$PG_STARTED_BY_US" -m fast -w stop >/dev/null 2>&1 || true
    PG_STARTED_BY_US=""
  fi
}

# pg_database PORT DB [fresh]: make sure role crankjournal (password in .data/pg-crankjournal-password) owns database DB
# (dropped first when fresh).
pg_database() {
  local port="$1" db="$2" fresh="${3:-}"
  local psql=(pg_admin "$port")
  local pw; pw="$(secret_file pg-crankjournal-password)"
  # The role's password is the generated one in .data/ (set again each time, so an older cluster follows).
  "${psql[@]}" -c "SET password_encryption = 'scram-sha-256'" \
    -c "DO \$\$BEGIN IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname='crankjournal') THEN CREATE ROLE crankjournal LOGIN; END IF; END\$\$;" \
    -c "ALTER ROLE crankjournal PASSWORD '$pw'" >/dev/null
  if [ "$fresh" = fresh ]; then "${psql[@]}" -c "DROP DATABASE IF EXISTS $db WITH (FORCE)" >/dev/null; fi
  if [ -z "$("${psql[@]}" -c "SELECT 1 FROM pg_database WHERE datname='$db'")" ]; then
    "${psql[@]}" -c "CREATE DATABASE $db OWNER crankjournal" >/dev/null
  fi
}

# start_standins SMTP_PORT MAIL_HTTP_PORT S3_PORT DATA_DIR [PAYMENTS_PORT WEBHOOK_URL]
# The payment stand-in uses PAYMENTS_API_KEY and PAYMENTS_WEBHOOK_SECRET from the environment when set.
start_standins() {
  local smtp="$1" mailhttp="$2" s3="$3" dir="$4" payments="${5:-}" webhook="${6:-}"
  node "$ROOT/ops/standins/mail-inbox.mjs" --smtp-port "$smtp" --http-port "$mailhttp" --dir "$dir/mail" &
  CHILD_PIDS+=($!)
  node "$ROOT/ops/standins/object-store.mjs" --port "$s3" --dir "$dir/objects" &
  CHILD_PIDS+=($!)
  if [ -n "$payments" ]; then
    node "$ROOT/ops/standins/payments.mjs" --port "$payments" --webhook-url "$webhook" \
      --api-key "${PAYMENTS_API_KEY:-sk_test_crankjournal_standin}" --webhook-secret "${PAYMENTS_WEBHOOK_SECRET:-whsec_crankjournal_standin}" &
    CHILD_PIDS+=($!)
  fi
  wait_for_port "$smtp" "mail inbox"
  wait_for_port "$s3" "object store"
  [ -z "$payments" ] || wait_for_port "$payments" "payment stand-in"
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
