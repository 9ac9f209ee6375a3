#!/usr/bin/env bash
# Start the local SMS fake (the hosted SMS service's Messages API on loopback, one JSON file per
# message under .data/sms/) unless it already runs.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
source "$(dirname "$0")/lib/start-service.sh"
cd "$ROOT"
if [ -z "$NUXT_SMS_FAKE_URL" ]; then
  log "NUXT_SMS_FAKE_URL is empty: texts go to the real SMS service; no SMS fake started"
  exit 0
fi
# The fake checks the app's credentials and signs its webhooks with the same token.
start_local_service sms-fake "SMS fake" SMS_FAKE_PORT "$SMS_FAKE_HOST" "$SMS_FAKE_PORT" "$SMS_DIR" -- \
  env SMS_FAKE_ACCOUNT_SID="$NUXT_SMS_ACCOUNT_SID" SMS_FAKE_AUTH_TOKEN="$NUXT_SMS_AUTH_TOKEN" node_modules/.bin/tsx scripts/sms-fake.ts
