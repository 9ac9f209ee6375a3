#!/usr/bin/env bash
# Build the app unless .output was built from exactly these sources.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
SOURCES=(app.vue nuxt.config.ts tailwind.config.ts package-lock.json assets components composables plugins
  layouts middleware pages public server shared stores db)
sources_hash() {
  local present=()
  for path in "${SOURCES[@]}"; do [ -e "$path" ] && present+=("$path"); done
  find "${present[@]}" -type f | LC_ALL=C sort | xargs sha256sum | sha256sum | cut -d' ' -f1
}
want="$(sources_hash)"
stamp=".output/.cuspline-sources-hash"
if [ -f "$stamp" ] && [ "$(cat "$stamp")" = "$want" ] && [ -f .output/server/index.mjs ]; then
  log "build is up to date"
  exit 0
fi
log "building the app (nuxt build)"
node_modules/.bin/nuxt build >"$DATA_DIR/build.log" 2>&1 || { tail -40 "$DATA_DIR/build.log" >&2; exit 1; }
echo "$want" > "$stamp"
