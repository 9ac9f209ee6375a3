#!/usr/bin/env bash
# npm run test:cluster: a fresh cluster (scripts/cluster/start.sh), the cluster suite
# (tests/cluster) against it, then the cluster stopped again whatever the outcome.
set -euo pipefail
source "$(dirname "$0")/env.sh"
cd "$ROOT"
# Claimed outbox rows of a killed app process are taken over after this lease.
export NUXT_OUTBOX_LEASE_SECONDS="${NUXT_OUTBOX_LEASE_SECONDS:-10}" NUXT_OUTBOX_POLL_MS="${NUXT_OUTBOX_POLL_MS:-500}"
trap 'bash scripts/cluster/stop.sh' EXIT
CLUSTER_FRESH="${CLUSTER_FRESH:-1}" CLUSTER_SKIP_DEMO_VISITS="${CLUSTER_SKIP_DEMO_VISITS:-1}" bash scripts/cluster/start.sh
mkdir -p tests/artifacts
bash scripts/with-env.sh vitest run --config scripts/cluster/vitest.config.ts "$@"
