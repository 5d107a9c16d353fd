#!/usr/bin/env bash
# npm run serve: one more service instance against the cluster and stand-ins a running `npm start` set up
# (its settings in .data/serve.env), on PORT (default 3001). No migration and no seed: npm start did both.
# Ctrl-C stops this instance only.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

SERVE_ENV="$ROOT/.data/serve.env"
PORT="${PORT:-3001}"
[ -f "$SERVE_ENV" ] || { say "no running npm start found ($SERVE_ENV is missing): start it first, then npm run serve"; exit 1; }
# shellcheck source=/dev/null
source "$SERVE_ENV"
port_free "$PORT" || { say "port $PORT is already in use: choose another, e.g. PORT=$((PORT + 1)) npm run serve"; exit 1; }
[ -f "$ROOT/service/dist/main.js" ] || { say "the service is not built (npm start builds it)"; exit 1; }

export PORT
say "starting one more instance on http://$HOST:$PORT (same database, mail and object store as npm start)"
cd "$ROOT/service" && exec node dist/main.js
