#!/usr/bin/env bash
# Start the local mail catcher (SMTP on loopback, one .eml file per message) unless it already runs.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
mkdir -p "$MAIL_DIR"
port_open() { node -e "const s=require('net').connect(+process.argv[1],process.argv[2]);s.on('connect',()=>process.exit(0));s.on('error',()=>process.exit(1))" "$SMTP_PORT" "$SMTP_HOST"; }
if port_open; then
  exit 0
fi
log "starting mail catcher on $SMTP_HOST:$SMTP_PORT, writing to $MAIL_DIR"
setsid nohup node_modules/.bin/tsx scripts/mail-catcher.ts >"$DATA_DIR/mail-catcher.log" 2>&1 < /dev/null &
echo $! > "$DATA_DIR/mail-catcher.pid"
for _ in $(seq 1 40); do
  port_open && exit 0
  sleep 0.25
done
echo "mail catcher did not start; see $DATA_DIR/mail-catcher.log" >&2
exit 1
