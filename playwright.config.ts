/**
 * Browser tests in Chromium (Debian's, or $CHROMIUM_PATH) against the built app served by server/main.ts.
 * The app is built first when stale (also by `npm test`); set DEWLINE_URL to test an already running server instead.
 */
import { defineConfig } from '@playwright/test';
import os from 'node:os';
import path from 'node:path';
import { findChromium } from './scripts/find-chromium.mjs';

const port = Number(process.env.DEWLINE_E2E_PORT ?? 3417);
const external = process.env.DEWLINE_URL;

export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-results/playwright',
  workers: 1,
  timeout: 180_000,
  expect: { timeout: 30_000 },
  retries: 0,
  use: {
    baseURL: external ?? `http://127.0.0.1:${port}`,
    viewport: { width: 1280, height: 800 },
    screenshot: 'only-on-failure',
    launchOptions: {
      executablePath: (findChromium() as string | null) ?? '/usr/bin/chromium',
      args: ['--no-sandbox', '--headless', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    },
  },
  webServer: external
    ? undefined
    : {
        // Builds first when the sources are newer than the build, so a direct `npx playwright test` never tests a stale app.
        command: `node scripts/build-if-stale.mjs && node node_modules/tsx/dist/cli.mjs server/main.ts`,
        url: `http://127.0.0.1:${port}/healthz`,
        reuseExistingServer: false,
        timeout: 300_000,
        env: { PORT: String(port), HOST: '127.0.0.1', NODE_ENV: 'production', DEWLINE_DB: path.join(os.tmpdir(), `dewline-e2e-${process.pid}.sqlite`) },
      },
});
