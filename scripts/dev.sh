#!/usr/bin/env bash
# npm run dev: provision, seed, then Nuxt's dev server with hot reload.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
bash scripts/provision.sh
bash scripts/with-env.sh tsx scripts/db-seed.ts
exec bash scripts/with-env.sh nuxt dev --host "$HOST" --port "$PORT"
