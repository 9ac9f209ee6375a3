#!/usr/bin/env bash
# npm ci when node_modules is missing or older than package-lock.json.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
stamp="node_modules/.cuspline-lock-hash"
want="$(sha256sum package-lock.json | cut -d' ' -f1)"
if [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$want" ]; then
  exit 0
fi
log "installing npm packages (npm ci)"
npm ci --no-audit --no-fund --loglevel=error
echo "$want" > "$stamp"
