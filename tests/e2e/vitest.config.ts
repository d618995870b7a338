import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// End-to-end: the production build served by the real server, driven in Debian's Chromium.
export default defineConfig({
  root: fileURLToPath(new URL('../..', import.meta.url)),
  test: {
    include: ['tests/e2e/**/*.e2e.test.ts'],
    environment: 'node',
    globalSetup: ['tests/support/postgres-global-setup.ts'],
    env: { LOG_LEVEL: 'silent' },
    fileParallelism: false,
    testTimeout: 90_000,
    hookTimeout: 120_000,
  },
});
