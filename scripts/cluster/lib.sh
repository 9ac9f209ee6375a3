# Functions for the local Galera cluster: one node, HAProxy, one app process. Source it after env.sh.

# The nodes run as Debian's mysql user, not root: the joiner's rsync daemon (wsrep_sst_rsync) started
# by root would switch to 'nobody' and could not write the data directory.
CLUSTER_DB_OS_USER="${CLUSTER_DB_OS_USER:-mysql}"

ensure_cluster_packages() {
  local missing=()
  command -v mariadbd >/dev/null 2>&1 || missing+=(mariadb-server)
  [ -e /usr/lib/galera/libgalera_smm.so ] || missing+=(galera-4)
  command -v haproxy >/dev/null 2>&1 || missing+=(haproxy)
  command -v rsync >/dev/null 2>&1 || missing+=(rsync)
  if [ ${#missing[@]} -gt 0 ]; then
    apt_install mariadb-server galera-4 haproxy rsync
    # Debian's packages may start their own services; the cluster never uses them.
    (service mariadb stop || true) >/dev/null 2>&1
    (service haproxy stop || true) >/dev/null 2>&1
  fi
}

# The nodes run as the database's OS user, who must be able to pass through every directory above
# their data. A fresh clone under a private temporary directory (mode 700, as CI's may be) does not
# let it: give those directories the search bit (o+x) only, never read.
let_db_user_through() {
  local d; d="$(dirname "$1")"
  while [ "$d" != "/" ] && [ -n "$d" ]; do
    chmod o+x "$d" 2>/dev/null || true
    d="$(dirname "$d")"
  done
}

write_node_config() {
  local n="$1" dir; dir="$(node_dir "$n")"
  mkdir -p "$dir/data"
  let_db_user_through "$dir"
  chown -R "$CLUSTER_DB_OS_USER:" "$dir" 2>/dev/null || true
  cat > "$dir/my.cnf" <<CNF
# Node $n of the local Galera cluster (written by scripts/cluster/lib.sh; edits are overwritten).
[mysqld]
datadir=$dir/data
socket=$dir/mariadb.sock
pid-file=$dir/mariadb.pid
log-error=$dir/mariadb.err
port=$(node_port "$n")
bind-address=127.0.0.1
user=$CLUSTER_DB_OS_USER
skip-name-resolve
character-set-server=utf8mb4
collation-server=utf8mb4_unicode_ci
max-connections=300
# Small: three nodes share a 2-core machine with other work.
innodb-buffer-pool-size=64M
innodb-log-file-size=32M
performance-schema=OFF
aria-pagecache-buffer-size=8M
key-buffer-size=8M
# Durable on each node, as the single database is (scripts/db-start.sh).
innodb-flush-log-at-trx-commit=1
# What Galera needs.
default-storage-engine=InnoDB
binlog-format=ROW
innodb-autoinc-lock-mode=2
wsrep-on=ON
wsrep-provider=/usr/lib/galera/libgalera_smm.so
wsrep-cluster-name=cuspline
wsrep-cluster-address=gcomm://127.0.0.1:$(node_galera_port 1),127.0.0.1:$(node_galera_port 2),127.0.0.1:$(node_galera_port 3)
wsrep-node-name=n$n
wsrep-node-address=127.0.0.1:$(node_galera_port "$n")
wsrep-node-incoming-address=127.0.0.1:$(node_port "$n")
wsrep-provider-options="gmcast.listen_addr=tcp://127.0.0.1:$(node_galera_port "$n");ist.recv_addr=127.0.0.1:$(node_ist_port "$n");gcache.size=32M;gcache.page_size=16M;evs.suspect_timeout=PT3S;evs.inactive_timeout=PT5S;evs.inactive_check_period=PT0.5S"
wsrep-sst-method=rsync
wsrep-sst-receive-address=127.0.0.1:$(node_sst_port "$n")
wsrep-slave-threads=2
# Every table needs a primary key (Galera replicates row events by key).
wsrep-mode=REQUIRED_PRIMARY_KEY
# The migrations create triggers as the app user; with ROW events they are safe to replicate.
log-bin-trust-function-creators=1
CNF
}

# start_node N [--wsrep-new-cluster]: starts mariadbd for node N and waits until it is Synced.
start_node() {
  local n="$1" bootstrap="${2:-}" dir; dir="$(node_dir "$n")"
  if node_up "$n"; then return 0; fi
  write_node_config "$n"
  if [ "$bootstrap" = "--wsrep-new-cluster" ]; then
    if [ ! -d "$dir/data/mysql" ]; then
      log "initialising node $n's data directory"
      mariadb-install-db --no-defaults --datadir="$dir/data" --user="$CLUSTER_DB_OS_USER" \
        --auth-root-authentication-method=socket --skip-test-db >"$dir/install.log" 2>&1
    fi
    # A cluster stopped by cluster:stop leaves node 1 last and safe to bootstrap; after a crash
    # the flag is 0 and this local test cluster bootstraps from node 1 anyway.
    [ -f "$dir/data/grastate.dat" ] && sed -i 's/^safe_to_bootstrap: 0/safe_to_bootstrap: 1/' "$dir/data/grastate.dat"
  fi
  local position=""
  if [ -z "$bootstrap" ] && [ -d "$dir/data/mysql" ] && grep -q '^seqno: *-1' "$dir/data/grastate.dat" 2>/dev/null; then
    # Killed rather than shut down: the last committed position is only in InnoDB. Find it first
    # (as Debian's mysqld_safe does with --wsrep-recover), so the node asks for an incremental
    # transfer (IST) of what it missed instead of a full copy (SST).
    mariadbd --defaults-file="$dir/my.cnf" --wsrep-recover --log-error="$dir/recover.err" >/dev/null 2>&1 || true
    position="$(sed -n 's/.*WSREP: Recovered position: *\([^ ]*\).*/\1/p' "$dir/recover.err" | tail -1)"
    rm -f "$dir/recover.err"
    [ -n "$position" ] && log "node $n recovered its position $position"
  fi
  log "starting Galera node $n on 127.0.0.1:$(node_port "$n") ${bootstrap:+(bootstrapping a new cluster)}"
  # shellcheck disable=SC2086
  setsid nohup mariadbd --defaults-file="$dir/my.cnf" $bootstrap ${position:+--wsrep-start-position=$position} >/dev/null 2>&1 < /dev/null &
  wait_node_synced "$n"
}

wait_node_synced() {
  local n="$1"
  for _ in $(seq 1 360); do
    if node_up "$n" && [ "$(node_state "$n")" = "Synced" ]; then return 0; fi
    sleep 0.5
  done
  echo "Galera node $n did not reach Synced; see $(node_dir "$n")/mariadb.err" >&2
  tail -30 "$(node_dir "$n")/mariadb.err" >&2
  return 1
}

stop_node() {
  local n="$1" pid; pid="$(node_pid "$n")"
  if node_up "$n"; then
    mariadb-admin --no-defaults --protocol=socket --socket="$(node_socket "$n")" -uroot shutdown >/dev/null 2>&1 || true
  fi
  if [ -n "$pid" ]; then
    for _ in $(seq 1 120); do kill -0 "$pid" 2>/dev/null || break; sleep 0.5; done
    kill -9 "$pid" 2>/dev/null || true
  fi
  rm -f "$(node_dir "$n")/mariadb.pid"
}

write_haproxy_config() {
  cat > "$CLUSTER_DIR/haproxy.cfg" <<CFG
# HAProxy for the local cluster (written by scripts/cluster/lib.sh; edits are overwritten).
global
  maxconn 4000

defaults
  timeout connect 2s
  timeout client 1h
  timeout server 1h
  timeout check 2s

# Every write (the whole app) goes to one node; the others are backups, taken in order when it
# fails. The one-entry stick table keeps writes on the node that took over even after the first
# comes back, so two nodes never take writes at once.
listen cuspline-write
  bind 127.0.0.1:$CLUSTER_WRITE_PORT
  mode tcp
  option mysql-check user haproxy_check post-41
  stick-table type ip size 1
  stick on dst
  default-server inter 1s fall 2 rise 2 on-marked-down shutdown-sessions
  server n1 127.0.0.1:$CLUSTER_NODE1_PORT check
  server n2 127.0.0.1:$CLUSTER_NODE2_PORT check backup
  server n3 127.0.0.1:$CLUSTER_NODE3_PORT check backup

# Reads that tolerate a little lag (nothing in the app uses it yet; reports and tools may).
listen cuspline-read
  bind 127.0.0.1:$CLUSTER_READ_PORT
  mode tcp
  balance leastconn
  option mysql-check user haproxy_check post-41
  default-server inter 1s fall 2 rise 2 on-marked-down shutdown-sessions
  server n1 127.0.0.1:$CLUSTER_NODE1_PORT check
  server n2 127.0.0.1:$CLUSTER_NODE2_PORT check
  server n3 127.0.0.1:$CLUSTER_NODE3_PORT check

# The app processes; a request that could not connect is sent to the other one.
listen cuspline-http
  bind 127.0.0.1:$CLUSTER_HTTP_PORT
  mode http
  balance roundrobin
  timeout client 60s
  timeout server 60s
  option redispatch
  retries 2
  option httpchk GET /api/me
  http-check expect status 401
  default-server inter 1s fall 2 rise 2
  server app1 127.0.0.1:$CLUSTER_APP1_PORT check
  server app2 127.0.0.1:$CLUSTER_APP2_PORT check
CFG
}

haproxy_running() { [ -s "$CLUSTER_DIR/haproxy.pid" ] && kill -0 "$(cat "$CLUSTER_DIR/haproxy.pid")" 2>/dev/null; }

start_haproxy() {
  haproxy_running && return 0
  write_haproxy_config
  haproxy -c -q -f "$CLUSTER_DIR/haproxy.cfg"
  log "starting HAProxy: writes 127.0.0.1:$CLUSTER_WRITE_PORT, reads :$CLUSTER_READ_PORT, app :$CLUSTER_HTTP_PORT"
  haproxy -D -f "$CLUSTER_DIR/haproxy.cfg" -p "$CLUSTER_DIR/haproxy.pid"
}

stop_haproxy() {
  if haproxy_running; then kill "$(cat "$CLUSTER_DIR/haproxy.pid")" 2>/dev/null || true; fi
  rm -f "$CLUSTER_DIR/haproxy.pid"
}

http_status() { node -e "fetch(process.argv[1]).then((r)=>console.log(r.status),()=>console.log(0))" "$1"; }

app_port() { local v="CLUSTER_APP$1_PORT"; echo "${!v}"; }
app_running() { [ -s "$CLUSTER_DIR/app$1.pid" ] && kill -0 "$(cat "$CLUSTER_DIR/app$1.pid")" 2>/dev/null; }

start_app() {
  local n="$1" port; port="$(app_port "$n")"
  app_running "$n" && return 0
  log "starting app process $n on 127.0.0.1:$port"
  local node_flags; read -ra node_flags <<< "${APP_NODE_FLAGS:-}"
  HOST=127.0.0.1 PORT="$port" NITRO_PORT="$port" NITRO_HOST=127.0.0.1 \
    setsid nohup node "${node_flags[@]}" "$CLUSTER_ROOT/.output/server/index.mjs" >"$CLUSTER_DIR/app$n.log" 2>&1 < /dev/null &
  echo $! > "$CLUSTER_DIR/app$n.pid"
  for _ in $(seq 1 120); do
    [ "$(http_status "http://127.0.0.1:$port/api/me")" = "401" ] && return 0
    sleep 0.25
  done
  echo "app process $n did not answer; see $CLUSTER_DIR/app$n.log" >&2
  tail -20 "$CLUSTER_DIR/app$n.log" >&2
  return 1
}

stop_app() {
  local n="$1" pid
  if app_running "$n"; then
    pid="$(cat "$CLUSTER_DIR/app$n.pid")"
    kill "$pid" 2>/dev/null || true
    for _ in $(seq 1 40); do kill -0 "$pid" 2>/dev/null || break; sleep 0.25; done
    kill -9 "$pid" 2>/dev/null || true
  fi
  rm -f "$CLUSTER_DIR/app$n.pid"
}
