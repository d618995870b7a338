import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { projectRoot } from '../../server/config';
import { seedDemoScenario } from '../../server/ops/demo-scenario';
import { createTestApp } from './test-app';
import { createTestDatabase, type TestDatabase } from './test-database';

export const builtClientDir = process.env['CLIENT_DIR'] ?? path.join(projectRoot, 'dist/rimelog/browser');

export interface RunningServer {
  url: string;
  database: TestDatabase;
  /** Stops accepting connections and drops open ones, as when the hut's Wi-Fi goes away. */
  stop(): Promise<void>;
}

/** The real server with the demo scenario and the production build, on a free loopback port. */
export async function startServerWithDemo(): Promise<RunningServer> {
  if (!existsSync(path.join(builtClientDir, 'ngsw.json'))) {
    throw new Error(`No production build in ${builtClientDir}: run \`npm run build\` first (npm test does).`);
  }
  const database = await createTestDatabase();
  await seedDemoScenario(database.db);
  const app = createTestApp(database, builtClientDir);
  const server: Server = await new Promise((resolve) => {
    const listening = app.listen(0, '127.0.0.1', () => resolve(listening));
  });
  const { port } = server.address() as AddressInfo;
  let stopped = false;
  return {
    url: `http://127.0.0.1:${port}`,
    database,
    async stop() {
      if (stopped) return;
      stopped = true;
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
