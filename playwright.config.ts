import { defineConfig } from '@playwright/test';

// HOLDFIRE_E2E_PORT lets two checkouts run the browser suite side by side.
export const E2E_PORT = Number(process.env.HOLDFIRE_E2E_PORT ?? 4310);
const baseURL = `http://localhost:${E2E_PORT}`;

// Debian's chromium, never a downloaded browser build; flags keep it off the network this machine lacks.
const chromium = {
  executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
  args: [
    '--headless',
    '--no-sandbox',
    '--disable-gpu',
    '--disable-quic',
    '--no-first-run',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
  ],
};

export default defineConfig({
  testDir: 'e2e',
  outputDir: 'test-results',
  fullyParallel: false,
  workers: 2,
  retries: 0,
  timeout: 45_000,
  expect: { timeout: 8_000 },
  reporter: [['list']],
  use: {
    baseURL,
    launchOptions: chromium,
    // CI keeps no files for anyone to open, and recording a trace of every test costs time on two cores: there a
    // failure leaves its page snapshot (error-context.md), which .ci/run prints.
    trace: process.env.CI ? 'off' : 'retain-on-failure',
    screenshot: 'only-on-failure',
  },
  projects: [
    { name: 'setup', testMatch: /auth\.setup\.ts/ },
    { name: 'browser', testMatch: /.*\.spec\.ts/, dependencies: ['setup'], use: { viewport: { width: 1280, height: 800 } } },
  ],
  webServer: {
    // A fresh data dir each run: the demo team is seeded anew and tests start from the same state.
    command: 'rm -rf e2e/.data && npx tsx server/index.ts',
    url: `${baseURL}/api/health`,
    reuseExistingServer: false,
    timeout: 60_000,
    env: {
      PORT: String(E2E_PORT),
      HOST: '127.0.0.1',
      HOLDFIRE_DATA_DIR: 'e2e/.data',
      DATABASE_URL: 'sqlite:e2e/.data/holdfire.sqlite',
      HOLDFIRE_SEED: 'demo',
      APP_URL: baseURL,
      NODE_ENV: 'test',
      // As `npm start` sets it: SQLite and file work share libuv's pool, 4 threads by default (DEVELOPERS.md).
      UV_THREADPOOL_SIZE: '16',
    },
  },
});
