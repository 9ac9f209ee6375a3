#!/usr/bin/env bash
# One part of the running cluster, for tests and by hand:
#   node.sh start N | stop N | kill N     (Galera node N; start rejoins it, by IST or SST)
#   node.sh app-start N | app-stop N | app-kill N   (app process N)
set -euo pipefail
source "$(dirname "$0")/env.sh"
source "$(dirname "$0")/lib.sh"
action="$1" n="$2"
case "$action" in
  start) start_node "$n" ;;
  stop) stop_node "$n" ;;
  kill) pid="$(node_pid "$n")"; [ -n "$pid" ] && kill -9 "$pid" ;;
  app-start) start_app "$n" ;;
  app-stop) stop_app "$n" ;;
  app-kill) kill -9 "$(cat "$CLUSTER_DIR/app$n.pid")" ;;
  *) echo "usage: node.sh start|stop|kill|app-start|app-stop|app-kill N" >&2; exit 2 ;;
esac
