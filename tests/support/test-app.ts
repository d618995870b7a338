import type { Express } from 'express';
import { createApp } from '../../server/app';
import { createLogger } from '../../server/logger';
import type { TestDatabase } from './test-database';

/** The real Express app over a test database, logging nothing. */
export function createTestApp(database: TestDatabase, clientDir?: string): Express {
  return createApp({ db: database.db, logger: createLogger('silent'), clientDir });
}
