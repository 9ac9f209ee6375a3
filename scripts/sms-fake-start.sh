#!/usr/bin/env bash
# Start the local SMS fake (the hosted SMS service's Messages API on loopback, one JSON file per
# message under .data/sms/) unless it already runs.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
if [ -z "$NUXT_SMS_FAKE_URL" ]; then
  log "NUXT_SMS_FAKE_URL is empty: texts go to the real SMS service; no SMS fake started"
  exit 0
fi
mkdir -p "$SMS_DIR"
port_open() { node -e "const s=require('net').connect(+process.argv[1],process.argv[2]);s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))" "$SMS_FAKE_PORT" "$SMS_FAKE_HOST"; }
ours_running() {
  [ -s "$DATA_DIR/sms-fake.pid" ] && kill -0 "$(cat "$DATA_DIR/sms-fake.pid")" 2>/dev/null &&
    [ "$(cat "$DATA_DIR/sms-fake.port" 2>/dev/null)" = "$SMS_FAKE_PORT" ]
}
if port_open; then
  # Something answers on the port: fine if it is this checkout's fake, otherwise texts would go to
  # another checkout's account (its token signs the callbacks) and every text test would wait in vain.
  ours_running && exit 0
  echo "SMS fake port $SMS_FAKE_HOST:$SMS_FAKE_PORT is taken by another program (not this checkout's SMS fake); stop it or set SMS_FAKE_PORT to a free port" >&2
  exit 1
fi
log "starting SMS fake on $SMS_FAKE_HOST:$SMS_FAKE_PORT, writing to $SMS_DIR"
# The fake checks the app's credentials and signs its webhooks with the same token.
SMS_FAKE_ACCOUNT_SID="$NUXT_SMS_ACCOUNT_SID" SMS_FAKE_AUTH_TOKEN="$NUXT_SMS_AUTH_TOKEN" \
  setsid nohup node_modules/.bin/tsx scripts/sms-fake.ts >"$DATA_DIR/sms-fake.log" 2>&1 < /dev/null &
echo $! > "$DATA_DIR/sms-fake.pid"
echo "$SMS_FAKE_PORT" > "$DATA_DIR/sms-fake.port"
for _ in $(seq 1 40); do
  port_open && exit 0
  sleep 0.25
done
echo "SMS fake did not start; see $DATA_DIR/sms-fake.log" >&2
exit 1
