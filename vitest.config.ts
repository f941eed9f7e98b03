import { configDefaults, defineConfig } from 'vitest/config';

// One runner for every layer of tests. Files that need the browser DOM opt in with
// `// @vitest-environment jsdom` at their top; API and e2e tests expect the local
// services that docker-free-local/test.sh starts (see DEVELOPERS.md).
//
// Two groups, one run (and one JSON report): every file, two at a time; then the timing-sensitive
// files, each on its own, so that no other test file competes for the cores while they measure
// (the liveness test asks /api/health to answer within 1 s during a large ingest).
const include = ['tests/**/*.test.ts', 'tests/**/*.test.tsx'];
const timingSensitive = ['tests/api/liveness.test.ts'];

export default defineConfig({
  test: {
    environment: 'node',
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 30_000,
    hookTimeout: 60_000,
    reporters: ['default'],
    setupFiles: ['tests/support/patience.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'all',
          include,
          exclude: [...configDefaults.exclude, ...timingSensitive],
          sequence: { groupOrder: 0 },
        },
      },
      {
        extends: true,
        test: { name: 'timing', include: timingSensitive, fileParallelism: false, sequence: { groupOrder: 1 } },
      },
    ],
  },
});
