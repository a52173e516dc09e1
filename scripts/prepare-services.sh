#!/usr/bin/env bash
# Everything the app needs before it can run (shared by `npm start` and `npm run dev`):
# Debian packages, npm packages, PostgreSQL, migrations, demo seed, session secret, local mail catcher.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT_DIR"
mkdir -p "$TRIBUTARY_STATE_DIR"

ensure_debian_packages "postgresql-client:psql"
ensure_node_modules
bash scripts/pg.sh start

log "running migrations and the demo seed"
npx tsx scripts/db-migrate.ts
npx tsx scripts/db-seed.ts

# A stable session secret for this checkout unless one is given.
if [ -z "${NUXT_SESSION_PASSWORD:-}" ]; then
  [ -s "$TRIBUTARY_STATE_DIR/session-secret" ] || node -e "process.stdout.write(require('crypto').randomBytes(36).toString('base64url'))" >"$TRIBUTARY_STATE_DIR/session-secret"
  NUXT_SESSION_PASSWORD="$(cat "$TRIBUTARY_STATE_DIR/session-secret")"
fi

# The local capturing SMTP server, unless a real SMTP host is configured.
if [ -z "${NUXT_SMTP_HOST:-}" ] || [ "${NUXT_SMTP_HOST}" = "127.0.0.1" ]; then
  export TRIBUTARY_MAIL_PORT="${TRIBUTARY_MAIL_PORT:-2525}" TRIBUTARY_MAIL_HTTP_PORT="${TRIBUTARY_MAIL_HTTP_PORT:-2526}"
  if ! (exec 3<>"/dev/tcp/127.0.0.1/${TRIBUTARY_MAIL_PORT}") 2>/dev/null; then
    log "starting the local capturing SMTP server on 127.0.0.1:${TRIBUTARY_MAIL_PORT}"
    nohup npx tsx scripts/mail-catcher.ts >"$TRIBUTARY_STATE_DIR/mail-catcher.log" 2>&1 &
  fi
  NUXT_SMTP_HOST=127.0.0.1; NUXT_SMTP_PORT="$TRIBUTARY_MAIL_PORT"
fi

cat >"$TRIBUTARY_STATE_DIR/runtime.env" <<ENV
export NUXT_DATABASE_URL='${NUXT_DATABASE_URL}'
export NUXT_SESSION_PASSWORD='${NUXT_SESSION_PASSWORD}'
export NUXT_SMTP_HOST='${NUXT_SMTP_HOST}'
export NUXT_SMTP_PORT='${NUXT_SMTP_PORT:-2525}'
ENV
