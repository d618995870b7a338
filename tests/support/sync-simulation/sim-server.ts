import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createTestApp } from '../test-app';
import type { TestDatabase } from '../test-database';

/** The real Express app on a loopback port; a restart closes it and serves a new app on a new port. */
export interface SimServer {
  /** Where the server listens now, e.g. http://127.0.0.1:40123. */
  origin(): string;
  /** Closes the HTTP server (dropping open connections) and starts a new app over the same database. */
  restart(): Promise<void>;
  close(): Promise<void>;
  restarts(): number;
}

async function listen(database: TestDatabase): Promise<{ server: Server; origin: string }> {
  const app = createTestApp(database);
  const server: Server = await new Promise((resolve, reject) => {
    const listening = app.listen(0, '127.0.0.1', (error?: Error) => (error ? reject(error) : resolve(listening)));
  });
  const { port } = server.address() as AddressInfo;
  return { server, origin: `http://127.0.0.1:${port}` };
}

async function stop(server: Server): Promise<void> {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
}

export async function startSimServer(database: TestDatabase): Promise<SimServer> {
  let current = await listen(database);
  let restarts = 0;
  let closed = false;
  return {
    origin: () => current.origin,
    async restart() {
      await stop(current.server);
      current = await listen(database);
      restarts++;
    },
    async close() {
      if (closed) return;
      closed = true;
      await stop(current.server);
    },
    restarts: () => restarts,
  };
}
