#!/usr/bin/env bash
# Start the local mail catcher (SMTP on loopback, one .eml file per message) unless it already runs.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
mkdir -p "$MAIL_DIR"
port_open() { node -e "const s=require('net').connect(+process.argv[1],process.argv[2]);s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))" "$SMTP_PORT" "$SMTP_HOST"; }
ours_running() {
  [ -s "$DATA_DIR/mail-catcher.pid" ] && kill -0 "$(cat "$DATA_DIR/mail-catcher.pid")" 2>/dev/null &&
    [ "$(cat "$DATA_DIR/mail-catcher.port" 2>/dev/null)" = "$SMTP_PORT" ]
}
if port_open; then
  # Something answers on the port: fine if it is this checkout's catcher, otherwise its mail would
  # land in another folder and every mail test would wait in vain.
  ours_running && exit 0
  echo "SMTP port $SMTP_HOST:$SMTP_PORT is taken by another program (not this checkout's mail catcher); stop it or set SMTP_PORT to a free port" >&2
  exit 1
fi
log "starting mail catcher on $SMTP_HOST:$SMTP_PORT, writing to $MAIL_DIR"
setsid nohup node_modules/.bin/tsx scripts/mail-catcher.ts >"$DATA_DIR/mail-catcher.log" 2>&1 < /dev/null &
echo $! > "$DATA_DIR/mail-catcher.pid"
echo "$SMTP_PORT" > "$DATA_DIR/mail-catcher.port"
for _ in $(seq 1 40); do
  port_open && exit 0
  sleep 0.25
done
echo "mail catcher did not start; see $DATA_DIR/mail-catcher.log" >&2
exit 1
