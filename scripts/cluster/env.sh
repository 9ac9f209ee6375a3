# Settings of the local Galera cluster (npm run cluster:start). Source it; do not run it.
# Every port can be moved with its own variable, or all at once with CLUSTER_PORT_BASE.
CLUSTER_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
export CLUSTER_DIR="${CLUSTER_DIR:-$CLUSTER_ROOT/.data/cluster}"
# The cluster keeps its own secrets, mail catcher and mail folder apart from the single database's.
export DATA_DIR="${CLUSTER_DIR}"
b="${CLUSTER_PORT_BASE:-4400}"
export CLUSTER_PORT_BASE="$b"
export CLUSTER_NODE1_PORT="${CLUSTER_NODE1_PORT:-$((b + 1))}" CLUSTER_NODE2_PORT="${CLUSTER_NODE2_PORT:-$((b + 2))}" CLUSTER_NODE3_PORT="${CLUSTER_NODE3_PORT:-$((b + 3))}"
export CLUSTER_NODE1_GALERA_PORT="${CLUSTER_NODE1_GALERA_PORT:-$((b + 11))}" CLUSTER_NODE2_GALERA_PORT="${CLUSTER_NODE2_GALERA_PORT:-$((b + 12))}" CLUSTER_NODE3_GALERA_PORT="${CLUSTER_NODE3_GALERA_PORT:-$((b + 13))}"
export CLUSTER_NODE1_IST_PORT="${CLUSTER_NODE1_IST_PORT:-$((b + 21))}" CLUSTER_NODE2_IST_PORT="${CLUSTER_NODE2_IST_PORT:-$((b + 22))}" CLUSTER_NODE3_IST_PORT="${CLUSTER_NODE3_IST_PORT:-$((b + 23))}"
export CLUSTER_NODE1_SST_PORT="${CLUSTER_NODE1_SST_PORT:-$((b + 31))}" CLUSTER_NODE2_SST_PORT="${CLUSTER_NODE2_SST_PORT:-$((b + 32))}" CLUSTER_NODE3_SST_PORT="${CLUSTER_NODE3_SST_PORT:-$((b + 33))}"
export CLUSTER_WRITE_PORT="${CLUSTER_WRITE_PORT:-$((b + 40))}"
export CLUSTER_READ_PORT="${CLUSTER_READ_PORT:-$((b + 41))}"
export CLUSTER_HTTP_PORT="${CLUSTER_HTTP_PORT:-$((b + 42))}"
export CLUSTER_SMTP_PORT="${CLUSTER_SMTP_PORT:-$((b + 43))}"
export CLUSTER_APP1_PORT="${CLUSTER_APP1_PORT:-$((b + 51))}" CLUSTER_APP2_PORT="${CLUSTER_APP2_PORT:-$((b + 52))}"
unset b

# The app and the scripts reach the database only through HAProxy's write listener.
export DB_HOST=127.0.0.1 DB_PORT="$CLUSTER_WRITE_PORT" DB_NAME="${CLUSTER_DB_NAME:-cuspline}"
export SMTP_HOST=127.0.0.1 SMTP_PORT="$CLUSTER_SMTP_PORT" MAIL_DIR="${CLUSTER_MAIL_DIR:-$CLUSTER_DIR/mail}"
export HOST=127.0.0.1 PORT="$CLUSTER_HTTP_PORT"
export NUXT_MAIL_PUBLIC_URL="${NUXT_MAIL_PUBLIC_URL:-http://127.0.0.1:$CLUSTER_HTTP_PORT}"
# shellcheck source=../lib/env.sh
source "$CLUSTER_ROOT/scripts/lib/env.sh"
export PATH="$PATH:/usr/sbin"

node_port() { local v="CLUSTER_NODE$1_PORT"; echo "${!v}"; }
node_galera_port() { local v="CLUSTER_NODE$1_GALERA_PORT"; echo "${!v}"; }
node_ist_port() { local v="CLUSTER_NODE$1_IST_PORT"; echo "${!v}"; }
node_sst_port() { local v="CLUSTER_NODE$1_SST_PORT"; echo "${!v}"; }
node_dir() { echo "$CLUSTER_DIR/n$1"; }
node_socket() { echo "$CLUSTER_DIR/n$1/mariadb.sock"; }
node_sql() { local n="$1"; shift; mariadb --no-defaults --protocol=socket --socket="$(node_socket "$n")" -uroot "$@"; }
node_up() { mariadb-admin --no-defaults --protocol=socket --socket="$(node_socket "$1")" -uroot ping >/dev/null 2>&1; }
node_pid() { cat "$(node_dir "$1")/mariadb.pid" 2>/dev/null || true; }
node_state() { node_sql "$1" -N -e "SHOW STATUS LIKE 'wsrep_local_state_comment'" 2>/dev/null | awk '{print $2}'; }
