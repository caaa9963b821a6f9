import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';

export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'server',
          environment: 'node',
          include: ['server/src/**/*.test.ts', 'policies/**/*.test.ts', 'scripts/**/*.test.ts', 'templates/**/*.test.ts'],
          globalSetup: ['server/src/test/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
          // Each file builds its own app and organizations; two workers match the 2-core machines.
          maxWorkers: 2,
          // Files share a worker's module cache instead of importing the whole server again for each
          // one (import time fell from about 190 s to about 50 s of the run). Safe because no server
          // test mocks a module, and each file builds its own app, clock and organizations; a file
          // that pins the clock or stubs the environment must restore it in its own afterAll.
          isolate: false,
        },
      },
      {
        plugins: [react()],
        test: {
          name: 'client',
          environment: 'happy-dom',
          include: ['client/src/**/*.test.{ts,tsx}'],
          setupFiles: ['client/src/test/setup.ts'],
          // Same as the server project: vitest refuses projects with different worker counts in one group.
          maxWorkers: 2,
        },
      },
    ],
  },
});
