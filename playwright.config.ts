import { defineConfig, devices } from '@playwright/test';

const port = Number(process.env.CAGEWRIGHT_E2E_PORT ?? 4391);
const baseURL = `http://127.0.0.1:${port}`;

// Debian's Chromium, never a downloaded browser. The flags keep it off the (closed) network.
export const chromiumLaunch = {
  executablePath: process.env.CAGEWRIGHT_CHROMIUM ?? '/usr/bin/chromium',
  args: [
    '--no-sandbox',
    '--disable-gpu',
    '--disable-quic',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
    '--no-first-run',
  ],
};

export default defineConfig({
  testDir: './e2e',
  outputDir: './test-results',
  fullyParallel: false,
  // A stray test.only must not shrink the suite in CI.
  forbidOnly: !!process.env.CI,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [['list']],
  use: {
    baseURL,
    launchOptions: chromiumLaunch,
    screenshot: 'only-on-failure',
    trace: 'off',
  },
  projects: [{ name: 'chromium', use: { ...devices['Desktop Chrome'], launchOptions: chromiumLaunch } }],
  webServer: {
    command: 'node scripts/e2e-server.mjs',
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    // A busy shared machine may need longer to start the server and seed the store.
    timeout: Number(process.env.CAGEWRIGHT_E2E_START_TIMEOUT_MS ?? 60_000),
    env: { PORT: String(port), HOST: '127.0.0.1', CAGEWRIGHT_OUT_DIR: process.env.CAGEWRIGHT_OUT_DIR ?? 'dist-test' },
  },
});
