import type { RequestHandler } from 'express';
import { verifyRequestOrigin } from 'lucia';
import { ApiError } from '../http/api-error';

const readOnly = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * SPEC.md §3: every state-changing request must carry an Origin header naming this server, so another
 * site cannot make a signed-in browser post records (cross-site request forgery).
 */
export const originCheck: RequestHandler = (req, _res, next) => {
  if (readOnly.has(req.method)) return next();
  const origin = req.headers.origin;
  const host = req.headers['x-forwarded-host']?.toString() ?? req.headers.host;
  if (!origin || !host || !verifyRequestOrigin(origin, [host])) {
    throw new ApiError('forbidden', 'This request did not come from the Rimelog app on this server, so it was refused.');
  }
  next();
};
