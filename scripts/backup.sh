#!/usr/bin/env bash
# npm run backup — see scripts/backup.ts. Puts the PostgreSQL client tools of the local
# installation (the same version as the server) first on PATH, then runs the TypeScript part.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
ensure_debian_packages "postgresql-client:psql"
bin="$(pg_bin_dir)"
[ -n "$bin" ] && export PATH="$bin:$PATH"
cd "$ROOT_DIR"
exec node --import tsx scripts/backup.ts "$@"
