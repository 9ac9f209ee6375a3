#!/usr/bin/env bash
# npm run cluster:start: a three-node MariaDB Galera cluster, HAProxy (write, read and HTTP
# listeners), two app processes and the mail catcher, all on loopback; the demo migrated and seeded
# through the write listener. Installs what is missing. Safe to run again.
# CLUSTER_FRESH=1 throws the cluster's data away first.
set -euo pipefail
if [ "${CLUSTER_FRESH:-}" = "1" ]; then
  # Before env.sh: it reads (or makes) the cluster's secrets in the directory removed here.
  bash "$(dirname "$0")/stop.sh"
  fresh_dir="${CLUSTER_DIR:-$(cd "$(dirname "$0")/../.." && pwd)/.data/cluster}"
  echo "removing $fresh_dir (CLUSTER_FRESH=1)"
  rm -rf "$fresh_dir"
fi
source "$(dirname "$0")/env.sh"
source "$(dirname "$0")/lib.sh"
cd "$ROOT"

bash scripts/ensure-node-modules.sh
ensure_cluster_packages

start_node 1 --wsrep-new-cluster
# The app's database and user, and the user HAProxy's mysql-check signs in as (no password, no
# rights: it only proves the node accepts connections). Galera replicates these to the others.
node_sql 1 <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`cuspline%\`.* TO '$DB_USER'@'127.0.0.1';
CREATE USER IF NOT EXISTS 'haproxy_check'@'127.0.0.1';
SQL
start_node 2
start_node 3
log "cluster size: $(node_sql 1 -N -e "SHOW STATUS LIKE 'wsrep_cluster_size'" | awk '{print $2}')"

start_haproxy
bash scripts/mail-start.sh
# Through the write listener, as the app will write.
for _ in $(seq 1 40); do
  mariadb --no-defaults -h127.0.0.1 -P"$CLUSTER_WRITE_PORT" -u"$DB_USER" -p"$DB_PASSWORD" -e 'SELECT 1' >/dev/null 2>&1 && break
  sleep 0.25
done
bash scripts/with-env.sh tsx scripts/db-migrate.ts latest
bash scripts/with-env.sh tsx scripts/db-seed.ts
bash scripts/build-if-stale.sh
if [ "${CLUSTER_SKIP_DEMO_VISITS:-}" != "1" ]; then
  bash scripts/with-env.sh tsx scripts/seed-demo-visits.ts
fi
start_app 1
start_app 2

cat <<TXT

  Cuspline runs on the Galera cluster at http://127.0.0.1:$CLUSTER_HTTP_PORT (HAProxy -> app processes :$CLUSTER_APP1_PORT, :$CLUSTER_APP2_PORT)
  Writes: 127.0.0.1:$CLUSTER_WRITE_PORT (node 1, then 2, then 3)   Reads: 127.0.0.1:$CLUSTER_READ_PORT
  Nodes: 127.0.0.1:$CLUSTER_NODE1_PORT, :$CLUSTER_NODE2_PORT, :$CLUSTER_NODE3_PORT (sockets in $CLUSTER_DIR/n*/)
  Mail catcher: smtp://127.0.0.1:$CLUSTER_SMTP_PORT -> $MAIL_DIR
  Stop everything with: npm run cluster:stop

TXT
