#!/usr/bin/env bash
# npm run test:future: the whole suite (or the vitest arguments given) with the clock a year ahead,
# to prove the tests hold on any date. libfaketime (Debian's `faketime`) moves the wall clock of
# everything started from here: the provisioning, a MariaDB of its own, the mail catcher, the app
# servers and vitest. Chromium does not run under libfaketime (it hangs); tests/helpers/browser.ts
# starts it without it and sets its pages' clock to the tests' time with playwright's page clock.
set -euo pipefail
ROOT="$(cd "$(dirname "$0")/.." && pwd)"
OFFSET="${FUTURE_OFFSET:-+365d}"

# A data directory of its own: its own MariaDB (datadir, socket, port), mail catcher and secrets, so
# the shifted clock never touches the practice server or the everyday test database.
export DATA_DIR="${FUTURE_DATA_DIR:-$ROOT/.data/future}"
export DB_PORT="${FUTURE_DB_PORT:-$(( ${DB_PORT:-3307} + 100 ))}"
export SMTP_PORT="${FUTURE_SMTP_PORT:-$(( ${SMTP_PORT:-1025} + 100 ))}"
export SMS_FAKE_PORT="${FUTURE_SMS_FAKE_PORT:-$(( ${SMS_FAKE_PORT:-4010} + 100 ))}"
export FUTURE_DATA_DIR="$DATA_DIR" FUTURE_DB_PORT="$DB_PORT" FUTURE_SMTP_PORT="$SMTP_PORT" FUTURE_SMS_FAKE_PORT="$SMS_FAKE_PORT" # the same in the second stage
unset DB_SOCKET MAIL_DIR SMS_DIR DB_PASSWORD NUXT_SESSION_PASSWORD NUXT_MAIL_LINK_SECRET NUXT_SMS_AUTH_TOKEN NUXT_SMS_ACCOUNT_SID NUXT_SMS_FAKE_URL
source "$ROOT/scripts/lib/env.sh"

if ! command -v faketime >/dev/null 2>&1; then
  apt_install faketime
fi

stop_future_services() {
  export PATH="$PATH:/usr/sbin"
  mariadb-admin --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot shutdown >/dev/null 2>&1 || true
  if [ -s "$DATA_DIR/mail-catcher.pid" ]; then
    kill "$(cat "$DATA_DIR/mail-catcher.pid")" >/dev/null 2>&1 || true
    rm -f "$DATA_DIR/mail-catcher.pid"
  fi
  if [ -s "$DATA_DIR/sms-fake.pid" ]; then
    kill "$(cat "$DATA_DIR/sms-fake.pid")" >/dev/null 2>&1 || true
    rm -f "$DATA_DIR/sms-fake.pid"
  fi
}

if [ "${1:-}" = "--inside-faketime" ]; then
  # Second stage, on the shifted clock. The MariaDB and mail catcher started from here are stopped
  # here too: `faketime` waits for every process that inherited its pipe, and it owns the shared
  # memory every faked process reads, so they must not outlive it.
  shift
  trap stop_future_services EXIT
  bash "$ROOT/scripts/test.sh" "$@"
  exit $?
fi

# Servers left from an earlier run may have started on another offset: start them afresh.
stop_future_services
log "running the tests with the clock moved by $OFFSET (libfaketime); MariaDB on $DB_PORT, data in $DATA_DIR"
# Monotonic clocks stay real: Node and MariaDB time their waits with them.
export FAKETIME_DONT_FAKE_MONOTONIC=1
exec faketime -f "$OFFSET" bash "$ROOT/scripts/test-future.sh" --inside-faketime "$@"
