#!/usr/bin/env bash
# npm run bench: every benchmark under scripts/bench/, figures printed (nothing asserted).
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
bash scripts/ensure-node-modules.sh
bash scripts/db-start.sh >/dev/null
bash scripts/build-if-stale.sh
for bench in scripts/bench/*.bench.ts; do
  log "$bench"
  bash scripts/with-env.sh tsx "$bench"
done
