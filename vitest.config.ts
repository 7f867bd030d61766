import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

// Unit tests (pure domain and components) run in-process; integration tests talk to a
// real built server started once by tests/integration/global-setup.ts.
export default defineConfig({
  resolve: { alias: { '~': fileURLToPath(new URL('./src', import.meta.url)) } },
  test: {
    // A stray .only fails the run in CI instead of quietly shrinking the suite.
    allowOnly: !process.env.CI,
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/unit/**/*.test.{ts,tsx}'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          globalSetup: ['tests/integration/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
