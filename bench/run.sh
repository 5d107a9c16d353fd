#!/usr/bin/env bash
# npm run bench: measures Crankjournal against its own throw-away set-up and writes BENCHMARKS.md.
#   a private PostgreSQL cluster on 127.0.0.1:55434 (fresh database crankjournal_bench), the mail and
#   object-store stand-ins on their own ports, a build of the service and of the UI (the UI into a private
#   folder), the built service as a separate process, then the benchmarks in bench/*.mjs one after another.
#   Benchmark 7 (visitor board) runs on two instances: a second service process on BENCH_APP2_PORT, same database,
#   started just before it and stopped after it. Not part of npm test. Takes about 10 to 15 minutes.
#
# Environment: BENCH_ONLY="1 2" runs only some benchmarks (the report keeps the page's other sections as they are);
# BENCH_SKIP_BUILD=1 reuses the current builds (the UI is built only when benchmark 5 runs); BENCH_HOLD=1 only sets
# up and seeds, then waits; BENCH_PROFILE=<folder> writes a CPU profile of each service process there (node
# --cpu-prof) when it stops. Ports: BENCH_PG_PORT, BENCH_SMTP_PORT, BENCH_MAIL_HTTP_PORT, BENCH_S3_PORT,
# BENCH_APP_PORT, BENCH_APP2_PORT (the second instance), BENCH_ECHO_PORT.
source "$(dirname "${BASH_SOURCE[0]}")/../ops/lib.sh"

PG_PORT="${BENCH_PG_PORT:-55434}"
SMTP_PORT="${BENCH_SMTP_PORT:-2555}"
MAIL_HTTP_PORT="${BENCH_MAIL_HTTP_PORT:-8055}"
S3_PORT="${BENCH_S3_PORT:-4599}"
APP_PORT="${BENCH_APP_PORT:-3290}"
APP2_PORT="${BENCH_APP2_PORT:-3292}"
ECHO_PORT="${BENCH_ECHO_PORT:-3291}"
DB_NAME="crankjournal_bench"
WORK="$ROOT/.data/bench"
ONLY="${BENCH_ONLY:-1 2 3 4 5 6 7}"
export BENCH_WORK="$WORK" BENCH_ROOT="$ROOT"
export BENCH_DB_URL="$(db_url "$PG_PORT" "$DB_NAME")"
BENCH_PG_SUPER_URL="postgres://postgres:$(secret_file pg-superuser-password)@127.0.0.1:$PG_PORT/$DB_NAME"
export BENCH_PG_SUPER_URL
export BENCH_BASE_URL="http://127.0.0.1:$APP_PORT"
export BENCH_BASE2_URL="http://127.0.0.1:$APP2_PORT"
# One signing secret for every service process of the run (both instances, and the same process restarted), as
# several instances behind one address need.
JWT_SECRET="bench-only-secret-$(head -c 12 /dev/urandom | base64 | tr -dc 'A-Za-z0-9')"
# In production the service refuses the payment stand-in's published keys; no benchmark takes a payment, so keys of
# the run's own (no payment stand-in is started).
PAY_KEY="sk_test_bench_only_$(head -c 12 /dev/urandom | base64 | tr -dc 'A-Za-z0-9')"
PAY_WEBHOOK_SECRET="whsec_bench_only_$(head -c 12 /dev/urandom | base64 | tr -dc 'A-Za-z0-9')"
export BENCH_ECHO_PORT="$ECHO_PORT"

SERVER_PID=""
SERVER2_PID=""
stop_pid() {  # stop_pid VAR: stops the process whose id the variable VAR holds, and empties it
  local pid="${!1}"
  if [ -n "$pid" ]; then
    kill "$pid" 2>/dev/null || true
    wait "$pid" 2>/dev/null || true
    printf -v "$1" '%s' ""
  fi
}
stop_server() { stop_pid SERVER_PID; }
stop_second() { stop_pid SERVER2_PID; unset BENCH_SERVER2_PID; }
cleanup() {
  trap - EXIT INT TERM
  say "bench: stopping the service, the stand-ins and the bench PostgreSQL cluster"
  stop_second; stop_server; stop_children; pg_down
}
trap cleanup EXIT
trap 'exit 130' INT TERM

STARTED_AT=$(date +%s)
for p in "$SMTP_PORT" "$MAIL_HTTP_PORT" "$S3_PORT" "$APP_PORT" "$APP2_PORT" "$ECHO_PORT"; do
  port_free "$p" || { say "port $p is already in use (is another bench running?)"; exit 1; }
done

ensure_node_modules
ensure_chromium
pg_up bench "$PG_PORT"
pg_database "$PG_PORT" "$DB_NAME" fresh
# The bench runs with durable commits (fsync on, as in production); a larger WAL keeps the bulk loads
# from checkpointing every few seconds.
pg_admin "$PG_PORT" -c "ALTER SYSTEM SET max_wal_size = '4GB'" -c "ALTER SYSTEM SET maintenance_work_mem = '512MB'" -c "SELECT pg_reload_conf()" >/dev/null
BENCH_PG_VERSION="$(pg_admin "$PG_PORT" -c 'SHOW server_version')"
export BENCH_PG_VERSION

rm -rf "$WORK/standins" "$WORK/tmp"
mkdir -p "$WORK/results" "$WORK/standins" "$WORK/tmp"
start_standins "$SMTP_PORT" "$MAIL_HTTP_PORT" "$S3_PORT" "$WORK/standins"

UI_OUT="$ROOT/bench/out/ui-dist"  # not under .data: the service will not send files from a dot folder
if [ -z "${BENCH_SKIP_BUILD:-}" ]; then
  say "bench: building shared-types and the service"
  # tsc still writes the JavaScript when it reports type errors; those are shown, and the bench goes on.
  (cd "$ROOT" && npm run build -w shared-types --silent && npm run build -w service --silent) \
    || say "bench: the service build reported errors (above); measuring the JavaScript it emitted"
  case " $ONLY " in
    *" 5 "*)
      say "bench: building the UI into $UI_OUT"
      (cd "$ROOT/ui" && "$ROOT/node_modules/.bin/vite" build --logLevel warn --outDir "$UI_OUT" --emptyOutDir)
      ;;
    *) say "bench: the UI is not built (only benchmark 5 needs it)" ;;
  esac
fi
export BENCH_UI_DIST="$UI_OUT"

say "bench: migrating the bench database"
(cd "$ROOT/service" && DATABASE_URL="$BENCH_DB_URL" node dist/database/migrate.js >/dev/null)

export BENCH_SERVER_LOG="$WORK/server.log"
export BENCH_SERVER2_LOG="$WORK/server2.log"
start_instance() {  # start_instance PORT LOG VAR: the built service on PORT, as in production; its pid into VAR
  local port="$1" logf="$2" var="$3"
  (cd "$ROOT/service" && NODE_ENV=production DATABASE_URL="$BENCH_DB_URL" PORT="$port" HOST=127.0.0.1 \
    PUBLIC_URL="$BENCH_BASE_URL" JWT_SECRET="$JWT_SECRET" \
    PAYMENTS_API_KEY="$PAY_KEY" PAYMENTS_WEBHOOK_SECRET="$PAY_WEBHOOK_SECRET" \
    ACCESS_TOKEN_TTL_SECONDS=7200 LOG_LEVEL=warn LOGIN_RATE_LIMIT_PER_MINUTE=100000 LOGIN_ADDRESS_LIMIT_PER_MINUTE=100000 LOGIN_ACCOUNT_LIMIT_PER_HOUR=100000 \
    VISIT_RATE_LIMIT_PER_MINUTE=100000 \
    SMTP_HOST=127.0.0.1 SMTP_PORT="$SMTP_PORT" MAIL_INBOX_URL="http://127.0.0.1:$MAIL_HTTP_PORT" \
    S3_ENDPOINT="http://127.0.0.1:$S3_PORT" UI_DIST="$UI_OUT" \
    exec node "${SERVICE_NODE_FLAGS[@]}" ${BENCH_PROFILE:+--cpu-prof --cpu-prof-dir="$BENCH_PROFILE" -r "$ROOT/bench/exit-on-term.cjs"} dist/main.js >>"$logf" 2>&1) &
  local pid=$!
  printf -v "$var" '%s' "$pid"
  for _ in $(seq 1 150); do
    (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null && return 0
    kill -0 "$pid" 2>/dev/null || break
    sleep 0.2
  done
  say "the service did not start on port $port; its log: $logf"; tail -n 30 "$logf"; exit 1
}
start_server() { start_instance "$APP_PORT" "$BENCH_SERVER_LOG" SERVER_PID; export BENCH_SERVER_PID="$SERVER_PID"; }
start_second() {  # a second instance of the service on the same database (benchmark 7)
  : >"$BENCH_SERVER2_LOG"
  start_instance "$APP2_PORT" "$BENCH_SERVER2_LOG" SERVER2_PID
  export BENCH_SERVER2_PID="$SERVER2_PID"
  say "bench: second instance, pid $SERVER2_PID on $BENCH_BASE2_URL"
}
: >"$BENCH_SERVER_LOG"
start_server
say "bench: service pid $SERVER_PID on $BENCH_BASE_URL"

say "bench: seeding users, engines, runs and a logger key"
node "$ROOT/bench/seed.mjs"

if [ -n "${BENCH_HOLD:-}" ]; then  # for working on a benchmark: keep the set-up running until stopped
  say "bench: holding; BENCH_SERVER_PID=$SERVER_PID; stop with kill $$"
  wait "$SERVER_PID"; exit 0
fi

run_bench() {  # run_bench N script: a failed benchmark is recorded and the others still run
  local n="$1" script="$2"
  case " $ONLY " in *" $n "*) ;; *) return 0 ;; esac
  say "bench $n: $script"
  local t0=$(date +%s)
  local rc=0
  node "$ROOT/bench/$script" || rc=$?
  if [ "$rc" != 0 ]; then
    say "bench $n failed (exit $rc); see above"
    node -e "require('fs').writeFileSync(process.argv[1], JSON.stringify({ failed: true, script: process.argv[2], at: new Date().toISOString() }))" "$WORK/results/b$n.failed.json" "$script"
  fi
  say "bench $n took $(( $(date +%s) - t0 )) s"
}

restart_server() { stop_server; start_server; }
wants() { case " $ONLY " in *" $1 "*) return 0 ;; *) return 1 ;; esac; }

for n in $ONLY; do rm -f "$WORK/results/b$n.failed.json"; done
run_bench 1 b1-alarm-latency.mjs
run_bench 2 b2-logger-ingest.mjs
# The import's memory is measured on a service process of its own (as after a restart), not on one that
# has just taken benchmark 2's batches.
if wants 3; then restart_server; fi
run_bench 3 b3-csv-import.mjs
if wants 4; then
  run_bench 4 b4-history-data.mjs
  # Restarted after the load, so the service's start-up pass keeps the closed runs' figures, as in service.
  restart_server
  run_bench 4 b4-bearing-history.mjs
fi
run_bench 5 b5-ui.mjs
run_bench 6 b6-autotrace.mjs
if wants 7; then
  start_second
  run_bench 7 b7-visitors.mjs
  stop_second
fi

stop_server
node "$ROOT/bench/report.mjs" --seconds "$(( $(date +%s) - STARTED_AT ))" --only "$ONLY"
say "bench: wrote $ROOT/BENCHMARKS.md in $(( $(date +%s) - STARTED_AT )) s"
