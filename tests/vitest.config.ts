import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// Node-side tests: shared/ (pure), server/ units, the device store on fake-indexeddb, and server
// integration tests (*.pg.test.ts)
// against a real throwaway PostgreSQL started by the global setup.
export default defineConfig({
  root: fileURLToPath(new URL('..', import.meta.url)),
  test: {
    include: ['shared/**/*.test.ts', 'server/**/*.test.ts', 'src/app/core/device-store/**/*.test.ts', 'tests/server/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/support/postgres-global-setup.ts'],
    env: { LOG_LEVEL: 'silent' },
    testTimeout: 30_000,
    hookTimeout: 120_000,
  },
});
