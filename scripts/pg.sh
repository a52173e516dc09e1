#!/usr/bin/env bash
# PostgreSQL on loopback for Tributary: `start` (idempotent), `stop`, `status`, `createdb NAME`, `dropdb NAME`.
# A private data dir and a non-default port; the server runs as the `postgres` user.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"

ensure_server_binaries() {
  local bin; bin="$(pg_bin_dir)"
  if [ -z "$bin" ] || [ ! -x "$bin/initdb" ]; then ensure_debian_packages "postgresql:/nonexistent/initdb"; fi
  ensure_debian_packages "postgresql-client:psql"
}

as_pg() { (cd / && if [ "$(id -u)" -eq 0 ]; then runuser -u postgres -- "$@"; else "$@"; fi); }
psql_admin() { (cd / && PGPASSWORD='' psql -h "$TRIBUTARY_PG_DIR" -p "$TRIBUTARY_PG_PORT" -U postgres -X -q -v ON_ERROR_STOP=1 "$@"); }

start() {
  ensure_server_binaries
  local bin; bin="$(pg_bin_dir)"
  mkdir -p "$(dirname "$TRIBUTARY_PG_DIR")"
  exec 9>"/tmp/tributary-pg-${TRIBUTARY_PG_PORT}.lock"
  flock 9
  if [ ! -s "$TRIBUTARY_PG_DIR/PG_VERSION" ]; then
    log "creating PostgreSQL data dir $TRIBUTARY_PG_DIR"
    mkdir -p "$TRIBUTARY_PG_DIR"
    [ "$(id -u)" -eq 0 ] && chown postgres:postgres "$TRIBUTARY_PG_DIR"
    chmod 700 "$TRIBUTARY_PG_DIR"
    as_pg "$bin/initdb" -D "$TRIBUTARY_PG_DIR" -U postgres --auth-local=trust --auth-host=scram-sha-256 -E UTF8 --locale=C.UTF-8 >/dev/null
  fi
  if ! "$bin/pg_isready" -q -h 127.0.0.1 -p "$TRIBUTARY_PG_PORT"; then
    # A crash can leave a stale pid file behind: remove it when its process is gone.
    if [ -f "$TRIBUTARY_PG_DIR/postmaster.pid" ]; then
      local pid; pid="$(head -n 1 "$TRIBUTARY_PG_DIR/postmaster.pid")"
      if ! kill -0 "$pid" 2>/dev/null; then rm -f "$TRIBUTARY_PG_DIR/postmaster.pid"; fi
    fi
    log "starting PostgreSQL on 127.0.0.1:$TRIBUTARY_PG_PORT"
    as_pg "$bin/pg_ctl" -w -t 60 -D "$TRIBUTARY_PG_DIR" -l "$TRIBUTARY_PG_DIR/server.log" \
      -o "-k $TRIBUTARY_PG_DIR -p $TRIBUTARY_PG_PORT -c listen_addresses=127.0.0.1 -c max_connections=200 ${TRIBUTARY_PG_EXTRA_OPTS:-}" start 9>&- >/dev/null
  fi
  psql_admin -d postgres <<SQL
DO \$\$ BEGIN
  IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = '${TRIBUTARY_DB_USER}') THEN
    CREATE ROLE "${TRIBUTARY_DB_USER}" LOGIN CREATEDB PASSWORD '${TRIBUTARY_DB_PASSWORD}';
  END IF;
END \$\$;
SQL
  createdb_if_missing "$TRIBUTARY_DB_NAME"
  flock -u 9
}

createdb_if_missing() {
  local name="$1"
  if [ "$(psql_admin -d postgres -tAc "SELECT 1 FROM pg_database WHERE datname = '$name'")" != "1" ]; then
    psql_admin -d postgres -c "CREATE DATABASE \"$name\" OWNER \"$TRIBUTARY_DB_USER\"" >/dev/null
  fi
}

stop() {
  local bin; bin="$(pg_bin_dir)"
  if [ -n "$bin" ] && [ -s "$TRIBUTARY_PG_DIR/PG_VERSION" ]; then
    as_pg "$bin/pg_ctl" -D "$TRIBUTARY_PG_DIR" -m fast stop >/dev/null 2>&1 && log "PostgreSQL stopped" || log "PostgreSQL was not running"
  fi
}

case "${1:-start}" in
  start) start ;;
  stop) stop ;;
  restart) stop; start ;;
  status) "$(pg_bin_dir)/pg_isready" -h 127.0.0.1 -p "$TRIBUTARY_PG_PORT" ;;
  createdb) createdb_if_missing "$2" ;;
  *) echo "usage: pg.sh start|stop|restart|status|createdb NAME" >&2; exit 2 ;;
esac
