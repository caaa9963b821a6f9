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

/**
 * The phone project runs the specs whose subject is a phone screen: the athlete's and the guardian's
 * flows, offline use, the phone layouts (sideways scroll, the plan editor at 375 px), and the pages'
 * accessibility for the people who use Loadline on a phone. Staff flows run on the desktop project and
 * open a phone inside them where a phone is part of the story (uploads, team programs, letters…).
 * This keeps the browser tests to one pass per screen rather than two of everything.
 */
const PHONE_SPECS = [
  'accessibility',
  'answer-contrast',
  'athlete',
  'athlete-week',
  'demo',
  'offline',
  'organizations',
  'pain-rule',
  'plan-editor-phone',
  'record-export',
].map((name) => `**/${name}.spec.ts`);
/** Specs about the phone alone: nothing to run on the desktop project. */
const PHONE_ONLY_SPECS = ['athlete', 'plan-editor-phone'].map((name) => `**/${name}.spec.ts`);

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
    { name: 'desktop', testIgnore: PHONE_ONLY_SPECS, use: { ...devices['Desktop Chrome'], launchOptions } },
    {
      name: 'phone',
      testMatch: PHONE_SPECS,
      use: { viewport: { width: 375, height: 740 }, isMobile: true, hasTouch: true, launchOptions },
    },
  ],
});
