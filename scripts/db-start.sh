#!/usr/bin/env bash
# Start the project's private MariaDB on loopback (installing Debian's mariadb-server if missing),
# then make sure the app databases and the app user exist. Safe to run again.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"

if ! command -v mariadbd >/dev/null 2>&1 && [ ! -x /usr/sbin/mariadbd ]; then
  apt_install mariadb-server
  # Debian's package may start its own server; we never use it.
  (service mariadb stop || true) >/dev/null 2>&1
fi
export PATH="$PATH:/usr/sbin"

datadir="$DATA_DIR/mariadb"
pidfile="$DATA_DIR/mariadb.pid"

root_sql() { mariadb --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot "$@"; }
is_up() { mariadb-admin --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot ping >/dev/null 2>&1; }

if ! is_up; then
  if [ ! -d "$datadir/mysql" ]; then
    log "initialising MariaDB data directory in $datadir"
    mkdir -p "$datadir"
    mariadb-install-db --no-defaults --datadir="$datadir" --user=root \
      --auth-root-authentication-method=socket --skip-test-db >"$DATA_DIR/mariadb-install.log" 2>&1
  fi
  log "starting MariaDB on $DB_HOST:$DB_PORT"
  # --no-defaults drops Debian's config, so the utf8mb4 settings are given here.
  # Durable: this server holds the practice's data (npm start), so every commit is written and
  # flushed to disk before it is acknowledged (flush-log-at-trx-commit=1), and the binary log, if
  # one is ever turned on, is synced at each commit too (sync-binlog=1). Tests use the same settings.
  setsid nohup mariadbd --no-defaults --user=root \
    --datadir="$datadir" --socket="$DB_SOCKET" --pid-file="$pidfile" \
    --port="$DB_PORT" --bind-address="$DB_HOST" --skip-name-resolve \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --innodb-flush-log-at-trx-commit=1 --sync-binlog=1 --max-connections=500 \
    --log-error="$DATA_DIR/mariadb.err" >/dev/null 2>&1 < /dev/null &
  for _ in $(seq 1 60); do
    is_up && break
    sleep 0.5
  done
  is_up || { echo "MariaDB did not start; see $DATA_DIR/mariadb.err" >&2; tail -20 "$DATA_DIR/mariadb.err" >&2; exit 1; }
fi

# A server started by an older version of this script may still run relaxed: make it durable now
# (both settings are dynamic, so no restart is needed).
root_sql -e "SET GLOBAL innodb_flush_log_at_trx_commit = 1; SET GLOBAL sync_binlog = 1;"

# The app user may arrive as user@127.0.0.1 or user@localhost; create both.
root_sql <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
CREATE USER IF NOT EXISTS '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'localhost' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`cuspline%\`.* TO '$DB_USER'@'127.0.0.1';
GRANT ALL PRIVILEGES ON \`cuspline%\`.* TO '$DB_USER'@'localhost';
FLUSH PRIVILEGES;
SQL
log "MariaDB ready: database $DB_NAME as $DB_USER"
