import { defineConfig, devices } from '@playwright/test';

/**
 * Browser tests against the built app, started by scripts/test.ts (E2E_BASE_URL). Debian's Chromium
 * is used; Playwright downloads no browser.
 */
const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const launchOptions = {
  executablePath: chromium,
  args: [
    '--no-sandbox',
    '--disable-gpu',
    '--disable-dev-shm-usage',
    '--disable-quic',
    '--no-first-run',
    '--disable-background-networking',
    '--disable-component-update',
    '--disable-sync',
  ],
};

export default defineConfig({
  testDir: 'e2e',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  reporter: [['list']],
  timeout: 30_000,
  use: {
    baseURL: process.env.E2E_BASE_URL ?? 'http://127.0.0.1:3000',
    launchOptions,
    screenshot: 'only-on-failure',
    trace: 'off',
  },
  projects: [
    { name: 'desktop', use: { ...devices['Desktop Chrome'], launchOptions } },
    { name: 'phone', use: { viewport: { width: 375, height: 740 }, isMobile: true, hasTouch: true, launchOptions } },
  ],
});
