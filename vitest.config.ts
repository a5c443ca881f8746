import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

/**
 * Four projects: `shared` (checker, pure), `server` (HTTP over createApp, node), `web` (React
 * components in jsdom) and `browser` (playwright-core driving Debian's chromium against the built
 * app; run by `npm run test:browser`).
 */
export default defineConfig({
  test: {
    projects: [
      { test: { name: 'shared', environment: 'node', include: ['tests/shared/**/*.test.ts'] } },
      { test: { name: 'server', environment: 'node', include: ['tests/server/**/*.test.ts'] } },
      {
        plugins: [react()],
        test: {
          name: 'web',
          environment: 'jsdom',
          include: ['tests/features/**/*.test.{ts,tsx}', 'tests/lib/**/*.test.{ts,tsx}'],
          setupFiles: ['tests/helpers/setup-dom.ts'],
        },
      },
      {
        test: {
          name: 'browser',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
