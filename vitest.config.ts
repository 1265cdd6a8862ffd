import { defineConfig } from 'vitest/config';

// Three projects: fast unit tests beside the code, integration tests against
// the real app + PGlite + local fakes, and browser journeys in Chromium.
// PGlite is memory-heavy and the machine has 2 cores: integration and browser
// files run in forks, at most two at once; the groups run one after another.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'src/**/*.test.{ts,tsx}', 'docker-free-fakes/**/*.test.ts'],
          environment: 'node',
          sequence: { groupOrder: 0 },
        },
      },
      {
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          globalSetup: ['tests/support/global-setup.ts'],
          pool: 'forks',
          maxWorkers: 2,
          sequence: { groupOrder: 1 },
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/support/global-setup.ts'],
          pool: 'forks',
          maxWorkers: 1,
          sequence: { groupOrder: 2 },
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
