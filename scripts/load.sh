#!/usr/bin/env bash
# `npm run load`: the same set-up as `npm start` (services, migrations, seed), a build when there is
# none, then scripts/load.ts (autocannon against the built server on loopback; see its header).
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT_DIR"
bash scripts/prepare-services.sh
if [ ! -f .output/server/index.mjs ]; then
  log "building the app"
  npx nuxt build >"$TRIBUTARY_STATE_DIR/build.log" 2>&1 || { tail -n 40 "$TRIBUTARY_STATE_DIR/build.log"; exit 1; }
fi
source "$TRIBUTARY_STATE_DIR/runtime.env"
exec node --import tsx scripts/load.ts
