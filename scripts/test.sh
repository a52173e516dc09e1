#!/usr/bin/env bash
# `npm test`: prepares the machine the same way as `npm start`, then runs every gate and every test suite:
# lint, typecheck, and the vitest projects unit, db, api (against the built server) and browser (Debian's Chromium).
# Prints a plain "N passed, N failed" line at the end. Extra arguments go to vitest (e.g. `npm test -- --project unit`).
set -uo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT_DIR"
mkdir -p "$TRIBUTARY_STATE_DIR"

set -e
ensure_debian_packages "postgresql-client:psql" "chromium:/usr/bin/chromium" "poppler-utils:pdfsig"
ensure_node_modules
export TRIBUTARY_PG_EXTRA_OPTS="-c fsync=off -c synchronous_commit=off -c full_page_writes=off"
bash scripts/pg.sh start
set +e

gate_failures=0
run_gate() {
  local name="$1"; shift
  log "$name"
  if "$@" >"$TRIBUTARY_STATE_DIR/$name.log" 2>&1; then log "$name: ok"; else
    gate_failures=$((gate_failures + 1)); tail -n 60 "$TRIBUTARY_STATE_DIR/$name.log"; log "$name: FAILED"; fi
}

if [ "${TRIBUTARY_SKIP_BUILD:-}" != "1" ]; then run_gate build npx nuxt build; fi
run_gate lint npx eslint .
run_gate typecheck npx vue-tsc -b --noEmit

log "vitest"
results="$TRIBUTARY_STATE_DIR/vitest-results.json"
rm -f "$results"
npx vitest run --reporter=default --reporter=json --outputFile.json="$results" "$@"
vitest_status=$?

node scripts/print-test-summary.mjs "$results" "$gate_failures"
summary_status=$?
[ $vitest_status -eq 0 ] && [ $summary_status -eq 0 ] && [ $gate_failures -eq 0 ]
