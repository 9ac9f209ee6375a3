#!/usr/bin/env bash
# Start the local mail catcher (SMTP on loopback, one .eml file per message) unless it already runs.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
source "$(dirname "$0")/lib/start-service.sh"
cd "$ROOT"
start_local_service mail-catcher "mail catcher" SMTP_PORT "$SMTP_HOST" "$SMTP_PORT" "$MAIL_DIR" -- \
  node_modules/.bin/tsx scripts/mail-catcher.ts
