# Shared settings for every provisioning script. Source it; do not run it.
# Every value can be overridden from the environment (CI moves the ports off the defaults).
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
export ROOT
export DATA_DIR="${DATA_DIR:-$ROOT/.data}"
export DB_HOST="${DB_HOST:-127.0.0.1}"
export DB_PORT="${DB_PORT:-3307}"
export DB_NAME="${DB_NAME:-cuspline}"
export DB_USER="${DB_USER:-cuspline}"
export DB_SOCKET="${DB_SOCKET:-$DATA_DIR/mariadb.sock}"
export SMTP_HOST="${SMTP_HOST:-127.0.0.1}"
export SMTP_PORT="${SMTP_PORT:-1025}"
export MAIL_DIR="${MAIL_DIR:-$DATA_DIR/mail}"
# The local stand-in for the hosted SMS service (scripts/sms-fake.ts), one JSON file per message.
export SMS_FAKE_HOST="${SMS_FAKE_HOST:-127.0.0.1}"
export SMS_FAKE_PORT="${SMS_FAKE_PORT:-4010}"
export SMS_DIR="${SMS_DIR:-$DATA_DIR/sms}"
export HOST="${HOST:-127.0.0.1}"
export PORT="${PORT:-3000}"
export NUXT_TELEMETRY_DISABLED=1
# How the app's Node process runs wherever it is started (npm start, the test and benchmark servers,
# the cluster): the JavaScript heap bounded, so resident memory stays under 250 MB at group scale
# (README, Performance). Set APP_NODE_FLAGS='' to run with Node's defaults.
export APP_NODE_FLAGS="${APP_NODE_FLAGS---max-old-space-size=192}"

mkdir -p "$DATA_DIR"

# A secret generated once into .data/ (never committed).
secret_file() {
  local file="$DATA_DIR/$1"
  if [ ! -s "$file" ]; then
    (umask 077; node -e "process.stdout.write(require('crypto').randomBytes(24).toString('hex'))" > "$file")
  fi
  cat "$file"
}

DB_PASSWORD="${DB_PASSWORD:-$(secret_file db-password)}"
export DB_PASSWORD
NUXT_SESSION_PASSWORD="${NUXT_SESSION_PASSWORD:-$(secret_file session-password)}"
export NUXT_SESSION_PASSWORD
NUXT_MAIL_LINK_SECRET="${NUXT_MAIL_LINK_SECRET:-$(secret_file mail-link-secret)}"
export NUXT_MAIL_LINK_SECRET
export NUXT_MAIL_PUBLIC_URL="${NUXT_MAIL_PUBLIC_URL:-http://$HOST:$PORT}"
# Calendar replies: each site's ORGANIZER address, and the secret the mail catcher signs its posts
# to the app's inbound endpoint with (as a hosted inbound-mail service would).
REPLY_ADDRESS_DEFAULT='replies+{site}@cuspline.test'
export NUXT_MAIL_REPLY_ADDRESS="${NUXT_MAIL_REPLY_ADDRESS-$REPLY_ADDRESS_DEFAULT}"
NUXT_MAIL_INBOUND_SECRET="${NUXT_MAIL_INBOUND_SECRET:-$(secret_file mail-inbound-secret)}"
export NUXT_MAIL_INBOUND_SECRET
# Where the catcher posts the replies it receives (the app started by npm start / npm run dev).
export INBOUND_MAIL_URL="${INBOUND_MAIL_URL:-http://$HOST:$PORT/api/inbound/mail}"
# Text messages: the local fake's account (the app and the fake share the token, as an account and
# the real service do). With real credentials set and NUXT_SMS_FAKE_URL empty the app talks to the real service.
NUXT_SMS_AUTH_TOKEN="${NUXT_SMS_AUTH_TOKEN:-$(secret_file sms-auth-token | cut -c1-32)}"
NUXT_SMS_ACCOUNT_SID="${NUXT_SMS_ACCOUNT_SID:-AC$(secret_file sms-account | cut -c1-32)}"
export NUXT_SMS_AUTH_TOKEN NUXT_SMS_ACCOUNT_SID
export NUXT_SMS_FROM="${NUXT_SMS_FROM:-+12095550100}"
export NUXT_SMS_FAKE_URL="${NUXT_SMS_FAKE_URL-http://$SMS_FAKE_HOST:$SMS_FAKE_PORT}"

# What the app reads (runtimeConfig is overridden by NUXT_* variables).
export NUXT_DB_HOST="$DB_HOST" NUXT_DB_PORT="$DB_PORT" NUXT_DB_USER="$DB_USER"
export NUXT_DB_PASSWORD="$DB_PASSWORD" NUXT_DB_DATABASE="$DB_NAME"
export NUXT_SMTP_HOST="$SMTP_HOST" NUXT_SMTP_PORT="$SMTP_PORT"
# The local server speaks plain HTTP on loopback, so the session cookie cannot be Secure here.
export NUXT_SESSION_COOKIE_SECURE="${NUXT_SESSION_COOKIE_SECURE:-false}"

log() { printf '\033[1;34m[cuspline]\033[0m %s\n' "$*"; }

# apt-get update runs at most once per script run.
APT_UPDATED=""
apt_install() {
  if [ -z "$APT_UPDATED" ]; then
    log "apt-get update"
    apt-get update -qq
    APT_UPDATED=1
  fi
  log "installing $*"
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "$@" >/dev/null
}
