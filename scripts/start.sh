#!/usr/bin/env bash
# `npm start`: every set-up step on a fresh machine, then serve Tributary on http://localhost:3000.
# Safe to run again: each step checks what is already there.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT_DIR"

bash scripts/prepare-services.sh

log "building the app"
npx nuxt build >"$TRIBUTARY_STATE_DIR/build.log" 2>&1 || { tail -n 40 "$TRIBUTARY_STATE_DIR/build.log"; echo "Build failed (full log: $TRIBUTARY_STATE_DIR/build.log)" >&2; exit 1; }

source "$TRIBUTARY_STATE_DIR/runtime.env"
export PORT="${PORT:-3000}" HOST="${HOST:-0.0.0.0}"
cat <<MSG

  Tributary is running at http://localhost:${PORT}

  Demo sign-ins (invented demo data; password for all: tributary-demo)
    administrator  admin@demo.tributary.test
    manager        manager@demo.tributary.test
    biologist      biologist@demo.tributary.test
    viewer         viewer@demo.tributary.test

  E-mail goes to the local capturing SMTP server (Administration → Outbox).
  Stop with Ctrl+C; \`npm run db:stop\` stops PostgreSQL.

MSG
# The simulation worker (pg-boss queue on the same database) runs beside the server and stops with it.
log "starting the simulation worker (log: $TRIBUTARY_STATE_DIR/worker.log)"
# Its own process group (setsid), so one signal reaches npm, tsx and the worker itself.
setsid npm run --silent worker >>"$TRIBUTARY_STATE_DIR/worker.log" 2>&1 &
WORKER_PID=$!
trap 'kill -TERM -- "-$WORKER_PID" 2>/dev/null || true; wait "$WORKER_PID" 2>/dev/null || true' EXIT
trap 'exit 130' INT TERM
# One app process per core (TRIBUTARY_SERVER_PROCESSES), see scripts/serve.mjs.
node scripts/serve.mjs
