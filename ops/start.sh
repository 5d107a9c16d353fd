#!/usr/bin/env bash
# npm start: installs what is missing, starts a private PostgreSQL, the mail and object-store
# stand-ins, migrates, seeds the demo site and serves UI and API on one port. Ctrl-C stops it all.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

PORT="${PORT:-3000}"
PG_PORT="${PG_PORT:-55432}"
SMTP_PORT="${SMTP_PORT:-2525}"
MAIL_HTTP_PORT="${MAIL_HTTP_PORT:-8025}"
S3_PORT="${S3_PORT:-4569}"
PAYMENTS_PORT="${PAYMENTS_PORT:-4242}"
DB_NAME="crankjournal"

SERVE_ENV="$ROOT/.data/serve.env"
cleanup() { trap - EXIT INT TERM; say "stopping"; rm -f "$SERVE_ENV"; stop_children; pg_down; }
trap cleanup EXIT
trap 'exit 130' INT TERM

for p in "$PORT" "$SMTP_PORT" "$MAIL_HTTP_PORT" "$S3_PORT" "$PAYMENTS_PORT"; do
  port_free "$p" || { say "port $p is already in use (is Crankjournal already running?)"; exit 1; }
done

ensure_node_modules
pg_up demo "$PG_PORT"
pg_database "$PG_PORT" "$DB_NAME"
build_all

export NODE_ENV="${NODE_ENV:-development}"
export DATABASE_URL="${DATABASE_URL:-$(db_url "$PG_PORT" "$DB_NAME")}"
export PORT HOST="${HOST:-127.0.0.1}"
export PUBLIC_URL="${PUBLIC_URL:-http://127.0.0.1:$PORT}"
export SMTP_HOST=127.0.0.1 SMTP_PORT
export MAIL_INBOX_URL="http://127.0.0.1:$MAIL_HTTP_PORT"
export S3_ENDPOINT="http://127.0.0.1:$S3_PORT"
export UI_DIST="$ROOT/ui/dist"
export PAYMENTS_API_URL="http://127.0.0.1:$PAYMENTS_PORT"
# Generated once, kept in .data/jwt-secret (0600); the service refuses to start without a secret of its own.
export JWT_SECRET="${JWT_SECRET:-$(secret_file jwt-secret)}"

start_standins "$SMTP_PORT" "$MAIL_HTTP_PORT" "$S3_PORT" "$ROOT/.data/demo" "$PAYMENTS_PORT" "$PUBLIC_URL/api/payments/webhook"
say "migrating and seeding the demo site"
(cd "$ROOT/service" && node dist/database/migrate.js && node dist/database/seeds/run-seed.js)

(cd "$ROOT/service" && exec node "${SERVICE_NODE_FLAGS[@]}" dist/main.js) &
CHILD_PIDS+=($!)
wait_for_port "$PORT" "Crankjournal"
# What `npm run serve` needs to start further instances against this cluster and these stand-ins (0600: it holds
# the database password and the JWT secret; removed when npm start stops).
(umask 077; for v in NODE_ENV DATABASE_URL HOST PUBLIC_URL SMTP_HOST SMTP_PORT MAIL_INBOX_URL S3_ENDPOINT UI_DIST JWT_SECRET; do
  printf 'export %s=%q\n' "$v" "${!v}"
done > "$SERVE_ENV")
cat <<INFO

  Crankjournal is running:   http://127.0.0.1:$PORT
  API documentation:         http://127.0.0.1:$PORT/api/docs
  Local mail inbox:          http://127.0.0.1:$MAIL_HTTP_PORT
  Payment stand-in:          http://127.0.0.1:$PAYMENTS_PORT (card 4242 4242 4242 4242 pays, 4000 0000 0000 0002 is declined)
  PostgreSQL (private):      127.0.0.1:$PG_PORT, data in $PGDATA_DIR
                             (passwords in .data/pg-superuser-password, .data/pg-crankjournal-password)

  Demo sign-ins (password: crankjournal-demo)
    admin@alderforge.example        administrator
    chief@alderforge.example        chief engineer
    operator@alderforge.example     engine operator
    maintenance@alderforge.example  maintenance lead
    mill@alderforge.example         mill lead
    observer@alderforge.example     observer

  Visitor board of the "Winter open day" run: switched on by the seed (its /visit/ address is on the
  seed line above); the chief engineer's "Visitor boards" screen has its QR page to print.

  More instances on this database:  PORT=3001 npm run serve   (see README, "Several instances")
  Ctrl-C stops everything.
INFO
wait "${CHILD_PIDS[-1]}"
