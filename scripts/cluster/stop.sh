#!/usr/bin/env bash
# npm run cluster:stop: stops the app processes, HAProxy, the mail catcher and the three nodes
# (node 1 last, so it is the one safe to bootstrap next time). Leaves nothing running.
set -euo pipefail
source "$(dirname "$0")/env.sh"
source "$(dirname "$0")/lib.sh"
for n in 1 2; do stop_app "$n"; done
stop_haproxy
if [ -s "$CLUSTER_DIR/mail-catcher.pid" ]; then
  kill "$(cat "$CLUSTER_DIR/mail-catcher.pid")" 2>/dev/null || true
  rm -f "$CLUSTER_DIR/mail-catcher.pid"
fi
for n in 3 2 1; do stop_node "$n"; done
log "cluster stopped"
