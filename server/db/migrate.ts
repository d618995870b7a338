import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import type { Database } from './client';

export const migrationsFolder = fileURLToPath(new URL('../../migrations', import.meta.url));

/** Applies every migration drizzle-kit generated into `migrations/` that the database lacks. */
export async function applyMigrations(db: Database): Promise<void> {
  await migrate(db, { migrationsFolder });
}
