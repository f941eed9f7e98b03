import { defineConfig } from 'vitest/config';

// One runner for every layer of tests. Files that need the browser DOM opt in with
// `// @vitest-environment jsdom` at their top; API and e2e tests expect the local
// services that docker-free-local/test.sh starts (see DEVELOPERS.md).
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    environment: 'node',
    pool: 'forks',
    maxWorkers: 2,
    testTimeout: 30_000,
    hookTimeout: 60_000,
    reporters: ['default'],
    setupFiles: ['tests/support/patience.ts'],
  },
});
