import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

// The cluster suite (npm run test:cluster): tests/cluster against the running Galera cluster
// (scripts/cluster/test.sh starts and stops it). One file at a time: they kill nodes and app processes.
export default defineConfig({
  root: fileURLToPath(new URL('../..', import.meta.url)),
  test: {
    name: 'cluster',
    environment: 'node',
    include: ['tests/cluster/**/*.test.ts'],
    fileParallelism: false,
    testTimeout: 600_000,
    hookTimeout: 300_000,
  },
})
