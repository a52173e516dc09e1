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

# The local S3-compatible object store (genotype files, attachments), unless another endpoint is
# configured. Started before the seed, which puts the demo genotype files there.
if [ -z "${NUXT_S3_ENDPOINT:-}" ]; then
  export TRIBUTARY_S3_PORT="${TRIBUTARY_S3_PORT:-4569}" TRIBUTARY_S3_DIR="${TRIBUTARY_S3_DIR:-$TRIBUTARY_STATE_DIR/object-store}"
  if ! (exec 3<>"/dev/tcp/127.0.0.1/${TRIBUTARY_S3_PORT}") 2>/dev/null; then
    log "starting the local object store on 127.0.0.1:${TRIBUTARY_S3_PORT}"
    nohup npx tsx scripts/object-store.ts >"$TRIBUTARY_STATE_DIR/object-store.log" 2>&1 &
    for _ in $(seq 1 100); do
      (exec 3<>"/dev/tcp/127.0.0.1/${TRIBUTARY_S3_PORT}") 2>/dev/null && break
      sleep 0.2
    done
  fi
  NUXT_S3_ENDPOINT="http://127.0.0.1:${TRIBUTARY_S3_PORT}"
fi
export NUXT_S3_ENDPOINT

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
# Object storage settings given in the environment are kept for the app (README: Settings).
for name in NUXT_S3_ENDPOINT NUXT_S3_REGION NUXT_S3_BUCKET NUXT_S3_ACCESS_KEY_ID NUXT_S3_SECRET_ACCESS_KEY NUXT_S3_FORCE_PATH_STYLE NUXT_S3_PUBLIC_ENDPOINT NUXT_S3_DOWNLOAD_LINK_SECONDS; do
  if [ -n "${!name:-}" ]; then printf "export %s='%s'\n" "$name" "${!name}" >>"$TRIBUTARY_STATE_DIR/runtime.env"; fi
done
