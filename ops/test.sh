#!/usr/bin/env bash
# npm test: every suite against a private, throw-away test set-up that does not disturb `npm start`.
#   a test PostgreSQL cluster on 127.0.0.1:55433 (fresh databases crankjournal_e2e and crankjournal_browser),
#   the mail and object-store stand-ins on test ports, then: service unit tests, service API end-to-end
#   tests, the reliability suite (crashes, bad input, roles matrix, CSV exports, backup/restore: service/test/reliability),
#   UI component tests and browser tests. Every suite runs even when an earlier one fails; the
#   summary at the end (ops/test-summary.mjs) decides the exit status.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

PG_PORT="${TEST_PG_PORT:-55433}"
SMTP_PORT="${TEST_SMTP_PORT:-2535}"
MAIL_HTTP_PORT="${TEST_MAIL_HTTP_PORT:-8035}"
S3_PORT="${TEST_S3_PORT:-4579}"
PAYMENTS_PORT="${TEST_PAYMENTS_PORT:-4252}"
APP_PORT="${TEST_APP_PORT:-3100}"
STANDINS_DIR="$ROOT/.data/test-standins"
RESULTS="$ROOT/.data/test-results"
E2E_DB="crankjournal_e2e"
BROWSER_DB="crankjournal_browser"
RELIABILITY_DB="crankjournal_reliability"
test_db_url() { db_url "$PG_PORT" "$1"; }

# The test cluster only holds throw-away data: no need to wait for the disk.
export PG_FSYNC=off

cleanup() { trap - EXIT INT TERM; say "stopping the test stand-ins and the test PostgreSQL cluster"; stop_children; pg_down; }
trap cleanup EXIT
trap 'exit 130' INT TERM

STARTED_AT=$(date +%s)
for p in "$SMTP_PORT" "$MAIL_HTTP_PORT" "$S3_PORT" "$PAYMENTS_PORT" "$APP_PORT"; do
  port_free "$p" || { say "port $p is already in use (is another npm test running?)"; exit 1; }
done

ensure_node_modules
ensure_chromium
ensure_poppler
pg_up test "$PG_PORT"
rm -rf "$STANDINS_DIR" "$RESULTS"
mkdir -p "$STANDINS_DIR" "$RESULTS"
# The browser suite's service receives the payment stand-in's events; API tests register their own endpoint.
start_standins "$SMTP_PORT" "$MAIL_HTTP_PORT" "$S3_PORT" "$STANDINS_DIR" "$PAYMENTS_PORT" "http://127.0.0.1:$APP_PORT/api/payments/webhook"

# A failed build (for example the UI while it is being written) is reported, and the suites still run.
set +e
(set -e; build_all)
BUILD_RC=$?
set -e
[ "$BUILD_RC" = 0 ] || say "the build failed (exit $BUILD_RC); running the suites anyway"

# The gates come first: formatting, type checks (specs, API and browser tests included) and lint. Any finding
# fails npm test at once, before the suites spend their minutes.
say "gates: prettier --check, tsc --noEmit (shared-types, service with its tests, ui with e2e), eslint"
GATES_STARTED=$(date +%s)
if ! (cd "$ROOT" && npm run --silent gates); then
  say "a gate failed (see above): fix it, or run 'npm run format' / 'npm run lint -- --fix' for what they can fix"
  exit 1
fi
say "the gates took $(( $(date +%s) - GATES_STARTED )) s"

# The environment the service sees in the API tests and the browser tests.
export NODE_ENV=test
export JWT_SECRET="test-only-secret-0123456789abcdef"
# Every test signs in from 127.0.0.1; the reliability suite tests these limits with low values of its own.
export LOGIN_ADDRESS_LIMIT_PER_MINUTE=100000 LOGIN_ACCOUNT_LIMIT_PER_HOUR=100000
export SMTP_HOST=127.0.0.1 SMTP_PORT
export MAIL_INBOX_URL="http://127.0.0.1:$MAIL_HTTP_PORT"
export S3_ENDPOINT="http://127.0.0.1:$S3_PORT"
export PAYMENTS_API_URL="http://127.0.0.1:$PAYMENTS_PORT"

say "creating fresh test databases"
# The reliability suite creates and drops its own databases as the cluster's superuser.
RELIABILITY_PG_ADMIN_URL="postgres://postgres:$(secret_file pg-superuser-password)@127.0.0.1:$PG_PORT/postgres"
export RELIABILITY_PG_ADMIN_URL
pg_database "$PG_PORT" "$E2E_DB" fresh
pg_database "$PG_PORT" "$BROWSER_DB" fresh
pg_database "$PG_PORT" "$RELIABILITY_DB" fresh
(cd "$ROOT/service" && DATABASE_URL="$(test_db_url "$E2E_DB")" node dist/database/migrate.js)
(cd "$ROOT/service" && DATABASE_URL="$(test_db_url "$BROWSER_DB")" node dist/database/migrate.js \
  && DATABASE_URL="$(test_db_url "$BROWSER_DB")" node dist/database/seeds/run-seed.js)

set +e

say "suite 1/5: service unit tests"
(cd "$ROOT" && npm run test:unit -w service -- --json --outputFile="$RESULTS/unit.json")
UNIT_RC=$?

say "suite 2/5: service API end-to-end tests"
(cd "$ROOT" && DATABASE_URL="$(test_db_url "$E2E_DB")" LOG_LEVEL=silent LOGIN_RATE_LIMIT_PER_MINUTE=5 \
  npm run test:e2e -w service -- --json --outputFile="$RESULTS/e2e.json")
E2E_RC=$?

# Its own databases (crankjournal_reliability_*) and child service processes on free ports; it drops what it made.
say "suite 3/5: reliability suite (service/test/reliability)"
RELIABILITY_STARTED=$(date +%s)
(cd "$ROOT/service" && DATABASE_URL="$(test_db_url "$RELIABILITY_DB")" LOG_LEVEL=silent LOGIN_RATE_LIMIT_PER_MINUTE=5 \
  NODE_OPTIONS=--experimental-vm-modules npx jest --config test/reliability/jest.config.cjs --runInBand \
  --json --outputFile="$RESULTS/reliability.json")
RELIABILITY_RC=$?
say "the reliability suite took $(( $(date +%s) - RELIABILITY_STARTED )) s"

say "suite 4/5: UI component tests"
(cd "$ROOT" && npm run test -w ui -- --reporter=default --reporter=json --outputFile.json="$RESULTS/ui.json")
UI_RC=$?

say "suite 5/5: browser tests against the built service on 127.0.0.1:$APP_PORT"
BROWSER_RC=1
(cd "$ROOT/service" && DATABASE_URL="$(test_db_url "$BROWSER_DB")" PORT="$APP_PORT" HOST=127.0.0.1 \
  PUBLIC_URL="http://127.0.0.1:$APP_PORT" UI_DIST="$ROOT/ui/dist" LOG_LEVEL=warn LOGIN_RATE_LIMIT_PER_MINUTE=100 \
  exec node dist/main.js >"$RESULTS/browser-server.log" 2>&1) &
SERVER_PID=$!
CHILD_PIDS+=("$SERVER_PID")
server_up() {  # the port opens, or the server has ended (then no point waiting)
  for _ in $(seq 1 150); do
    (exec 3<>"/dev/tcp/127.0.0.1/$APP_PORT") 2>/dev/null && return 0
    kill -0 "$SERVER_PID" 2>/dev/null || return 1
    sleep 0.2
  done
  return 1
}
if server_up; then
  (cd "$ROOT" && BASE_URL="http://127.0.0.1:$APP_PORT" PLAYWRIGHT_JSON_OUTPUT_NAME="$RESULTS/browser.json" \
    npm run e2e -w ui -- --reporter=list,json)
  BROWSER_RC=$?
else
  say "the service did not start; its log: $RESULTS/browser-server.log"
  tail -n 20 "$RESULTS/browser-server.log" || true
fi
kill "$SERVER_PID" 2>/dev/null
wait "$SERVER_PID" 2>/dev/null

node "$ROOT/ops/test-summary.mjs" --dir "$RESULTS" \
  --suite "service unit=unit.json=$UNIT_RC" \
  --suite "service API e2e=e2e.json=$E2E_RC" \
  --suite "reliability=reliability.json=$RELIABILITY_RC" \
  --suite "UI components=ui.json=$UI_RC" \
  --suite "browser=browser.json=$BROWSER_RC" \
  --build "$BUILD_RC" --seconds "$(( $(date +%s) - STARTED_AT ))"
