import type { Express } from 'express';
import { randomUUID } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import type { ApiDeps } from '../../server/api-routes';
import { createApp, type AppOptions } from '../../server/app';
import { createLucia } from '../../server/auth/lucia';
import { createSignInLimits } from '../../server/auth/sign-in-limits';
import { createPasswordResetLimits } from '../../server/invitations/reset-limits';
import { createLogger } from '../../server/logger';
import { discardingMailer } from './fake-mail';
import type { TestDatabase } from './test-database';

/** The base URL e-mailed links carry in tests. */
export const testPublicUrl = 'http://rimelog.test';

export type TestAppOptions = Partial<Omit<AppOptions, 'db' | 'logger' | 'clientDir'>>;

/**
 * A fresh uploads folder for one test app, under the OS temporary folder. It is only created by the
 * first stored upload, so apps that store nothing leave nothing behind; a test that uploads removes it.
 */
export function temporaryUploadsDir(): string {
  return path.join(os.tmpdir(), `rimelog-uploads-${randomUUID()}`);
}

/**
 * The real Express app over a test database, logging nothing. Mail is discarded unless a mailer is
 * given (tests/support/fake-mail.ts has one to the real fake mail server). Uploads go to a temporary
 * folder of this app's own unless one is given (see temporaryUploadsDir).
 */
export function createTestApp(database: TestDatabase, clientDir?: string, options: TestAppOptions = {}): Express {
  return createApp({
    db: database.db,
    logger: createLogger('silent'),
    clientDir,
    ...options,
    uploadsDir: options.uploadsDir ?? temporaryUploadsDir(),
    mailer: options.mailer ?? discardingMailer(),
    publicUrl: options.publicUrl ?? testPublicUrl,
  });
}

/** Everything apiRoutes() needs, for tests that read the route list itself. */
export function testApiDeps(database: TestDatabase): ApiDeps {
  return {
    db: database.db,
    auth: createLucia(database.db),
    limits: createSignInLimits(),
    mailer: discardingMailer(),
    publicUrl: testPublicUrl,
    resetLimits: createPasswordResetLimits(),
  };
}
