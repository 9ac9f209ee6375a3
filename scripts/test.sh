#!/usr/bin/env bash
# npm test: the same provisioning on a fresh cuspline_test database, then every suite.
set -euo pipefail
export DB_NAME="${TEST_DB_NAME:-cuspline_test}"
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
bash scripts/ensure-node-modules.sh
bash scripts/ensure-chromium.sh
bash scripts/db-start.sh
bash scripts/mail-start.sh
bash scripts/sms-fake-start.sh
log "resetting $DB_NAME"
mariadb --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot \
  -e "DROP DATABASE IF EXISTS \`$DB_NAME\`; CREATE DATABASE \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
bash scripts/with-env.sh tsx scripts/db-migrate.ts latest
bash scripts/with-env.sh tsx scripts/db-seed.ts
bash scripts/build-if-stale.sh
log "type-checking (nuxt typecheck)"
node_modules/.bin/nuxt typecheck
log "linting (eslint)"
node_modules/.bin/eslint .
log "looking for unused files, exports and dependencies (knip)"
node_modules/.bin/knip
mkdir -p tests/artifacts
exec bash scripts/with-env.sh vitest run "$@"
