#!/usr/bin/env bash
# Everything `npm start` and `npm test` need before the app runs: packages, MariaDB, mail catcher,
# migrations. Idempotent.
set -euo pipefail
here="$(dirname "$0")"
bash "$here/ensure-node-modules.sh"
bash "$here/db-start.sh"
bash "$here/mail-start.sh"
bash "$here/sms-fake-start.sh"
bash "$here/with-env.sh" tsx scripts/db-migrate.ts latest
