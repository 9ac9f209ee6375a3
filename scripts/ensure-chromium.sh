#!/usr/bin/env bash
# Browser tests drive Debian's Chromium; install it when it is missing.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
if [ ! -x /usr/bin/chromium ]; then
  apt_install chromium
fi
