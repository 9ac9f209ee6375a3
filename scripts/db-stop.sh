#!/usr/bin/env bash
# Stop the private MariaDB cleanly.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
export PATH="$PATH:/usr/sbin"
if mariadb-admin --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot ping >/dev/null 2>&1; then
  mariadb-admin --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot shutdown
  log "MariaDB stopped"
else
  log "MariaDB was not running"
fi
