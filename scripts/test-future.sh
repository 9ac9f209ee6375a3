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
unset DB_SOCKET MAIL_DIR DB_PASSWORD NUXT_SESSION_PASSWORD NUXT_MAIL_LINK_SECRET
source "$ROOT/scripts/lib/env.sh"

faketime_lib() { dpkg -L libfaketime 2>/dev/null | grep '/libfaketime\.so\.1$' | head -1; }
if [ -z "$(faketime_lib)" ]; then
  apt_install faketime
fi
LIBFAKETIME="$(faketime_lib)"

stop_future_services() {
  export PATH="$PATH:/usr/sbin"
  mariadb-admin --no-defaults --protocol=socket --socket="$DB_SOCKET" -uroot shutdown >/dev/null 2>&1 || true
  if [ -s "$DATA_DIR/mail-catcher.pid" ]; then
    kill "$(cat "$DATA_DIR/mail-catcher.pid")" >/dev/null 2>&1 || true
    rm -f "$DATA_DIR/mail-catcher.pid"
  fi
}
# Servers left from an earlier run may have started on another offset: start them afresh.
stop_future_services
trap stop_future_services EXIT

log "running the tests with the clock moved by $OFFSET (libfaketime); MariaDB on $DB_PORT, data in $DATA_DIR"
# The library is preloaded directly rather than through the `faketime` wrapper, which waits for every
# process that inherited its pipe (here the MariaDB and mail catcher it would outlive). A relative
# offset needs no state shared between processes. Monotonic clocks stay real: Node and MariaDB time
# their waits with them.
status=0
LD_PRELOAD="$LIBFAKETIME${LD_PRELOAD:+:$LD_PRELOAD}" FAKETIME="$OFFSET" FAKETIME_DONT_FAKE_MONOTONIC=1 \
  bash "$ROOT/scripts/test.sh" "$@" || status=$?
exit "$status"
