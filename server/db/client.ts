import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema>;

export interface DatabaseHandle {
  db: Database;
  pool: pg.Pool;
  close(): Promise<void>;
}

/**
 * A pool of at most 10 connections. A connection that dies while idle (PostgreSQL restarted, a test
 * database dropped) is reported and replaced on the next query; without a listener pg would end the
 * whole process.
 */
export function connectDatabase(url: string, onIdleError: (error: Error) => void = reportIdleError): DatabaseHandle {
  const pool = new pg.Pool({ connectionString: url, max: 10 });
  pool.on('error', onIdleError);
  const db = drizzle(pool, { schema });
  return { db, pool, close: () => pool.end() };
}

function reportIdleError(error: Error): void {
  process.emitWarning(`An idle database connection ended: ${error.message}`, 'DatabaseConnectionWarning');
}
