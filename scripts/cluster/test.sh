#!/usr/bin/env bash
# npm run test:cluster: a fresh cluster (scripts/cluster/start.sh), the cluster suite
# (tests/cluster) against it, then the cluster stopped again whatever the outcome.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
# Claimed outbox rows of a killed app process are taken over after this lease.
# A send that failed (the catcher paused past nodemailer's timeouts) is tried again soon.
export NUXT_OUTBOX_LEASE_SECONDS="${NUXT_OUTBOX_LEASE_SECONDS:-10}" NUXT_OUTBOX_POLL_MS="${NUXT_OUTBOX_POLL_MS:-500}"
# Small batches: tests/cluster/app-failover.test.ts waits until both dispatchers hold claims.
export NUXT_OUTBOX_BATCH_SIZE="${NUXT_OUTBOX_BATCH_SIZE:-5}"
export NUXT_OUTBOX_RETRY_BASE_SECONDS="${NUXT_OUTBOX_RETRY_BASE_SECONDS:-2}" NUXT_OUTBOX_RETRY_MAX_SECONDS="${NUXT_OUTBOX_RETRY_MAX_SECONDS:-10}"
trap 'bash scripts/cluster/stop.sh' EXIT
CLUSTER_FRESH="${CLUSTER_FRESH:-1}" CLUSTER_SKIP_DEMO_VISITS="${CLUSTER_SKIP_DEMO_VISITS:-1}" bash scripts/cluster/start.sh
mkdir -p tests/artifacts
bash scripts/with-env.sh vitest run --config scripts/cluster/vitest.config.ts "$@"
