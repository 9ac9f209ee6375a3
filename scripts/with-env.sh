#!/usr/bin/env bash
# Run a command with the project's environment (database, SMTP, secrets) set.
set -euo pipefail
source "$(dirname "$0")/lib/env.sh"
cd "$ROOT"
export PATH="$ROOT/node_modules/.bin:$PATH"
exec "$@"
