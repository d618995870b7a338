import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { apiRoutes } from './api-routes';
import { createLucia } from './auth/lucia';
import { originCheck } from './auth/origin-check';
import { sessionReader } from './auth/request-auth';
import { createSignInLimits, type SignInLimits } from './auth/sign-in-limits';
import type { Database } from './db/client';
import { mountRoutes } from './http/api-route';
import { clientFiles } from './http/client-files';
import { apiNotFound, errorHandler } from './http/error-handler';
import { createPasswordResetLimits, type PasswordResetLimits } from './invitations/reset-limits';
import type { Logger } from './logger';
import type { Mailer } from './mail/mailer';

export interface AppOptions {
  db: Database;
  logger: Logger;
  /** Folder of the built Angular app; when absent only the API is served. */
  clientDir?: string;
  /** Largest JSON body accepted, e.g. '1mb'. */
  jsonLimit?: string;
  /** Failed sign-in counting; one per app, so tests get a fresh one each. */
  signInLimits?: SignInLimits;
  /** Sends invitations and password resets. */
  mailer: Mailer;
  /** Base URL of this server as devices reach it, put in e-mailed links. */
  publicUrl: string;
  /** Password reset request counting; one per app, like the sign-in limits. */
  passwordResetLimits?: PasswordResetLimits;
  /**
   * Folder for evidence photos and calibration certificates (`<RIMELOG_DATA_DIR>/uploads`). There is no
   * default on purpose: a server without one answers 503 to uploads rather than keep evidence somewhere
   * temporary.
   */
  uploadsDir?: string;
  /** Largest upload accepted, in bytes; 10 MB unless given. */
  uploadLimitBytes?: number;
}

/** Builds the Express app without listening, so tests run it in-process on port 0. */
export function createApp({
  db,
  logger,
  clientDir,
  jsonLimit = '1mb',
  signInLimits = createSignInLimits(),
  mailer,
  publicUrl,
  passwordResetLimits = createPasswordResetLimits(),
  uploadsDir,
  uploadLimitBytes = 10 * 1024 * 1024,
}: AppOptions): Express {
  const auth = createLucia(db);
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Served over plain HTTP on loopback; TLS, when there is any, is added by a proxy in front.
          upgradeInsecureRequests: null,
          // Photos still on the device are shown from blob: addresses made of their stored bytes.
          imgSrc: ["'self'", 'data:', 'blob:'],
        },
      },
    }),
  );
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith('/api') } }));

  const api = express.Router();
  api.use(express.json({ limit: jsonLimit }));
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(originCheck);
  api.use(sessionReader(auth, db));
  const uploads = uploadsDir === undefined ? undefined : { dir: uploadsDir, limitBytes: uploadLimitBytes };
  mountRoutes(api, apiRoutes({ db, auth, limits: signInLimits, mailer, publicUrl, resetLimits: passwordResetLimits, uploads }));
  api.use(apiNotFound);
  app.use('/api', api);

  if (clientDir) app.use(clientFiles(clientDir));
  app.use(errorHandler);
  return app;
}
