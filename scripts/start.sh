#!/usr/bin/env bash
# npm start: provision, seed the demo into an empty database, build, serve on http://$HOST:$PORT.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
bash scripts/provision.sh
bash scripts/with-env.sh tsx scripts/db-seed.ts
bash scripts/build-if-stale.sh
# Demo visits go through the real booking service, so they need the built app.
bash scripts/with-env.sh tsx scripts/seed-demo-visits.ts
cat <<TXT

  Cuspline is running at http://$HOST:$PORT
  Demo sign-ins (password: cuspline-demo):
    admin@fernhollow.test        admin, all sites
    manager@fernhollow.test      manager, all sites
    desk.quarry@fernhollow.test  front desk, Quarry Street
    desk.aspen@fernhollow.test   front desk, Aspen Gulch
    dentist@fernhollow.test      dentist, Quarry Street and Saguaro Flats
    hygienist@fernhollow.test    hygienist, Aspen Gulch
  Mail catcher: smtp://$SMTP_HOST:$SMTP_PORT -> $MAIL_DIR
  SMS fake: $NUXT_SMS_FAKE_URL -> $SMS_DIR (a reply: npm run sms:inject -- --from +1… --body C)
  MariaDB: $DB_HOST:$DB_PORT (stop it with: npm run db:stop)

TXT
read -ra node_flags <<< "$APP_NODE_FLAGS"
exec node "${node_flags[@]}" .output/server/index.mjs
