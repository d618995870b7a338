import type { Request, RequestHandler, Response } from 'express';
import type { RoleAssignment } from '../../shared/auth/roles';
import type { Database } from '../db/client';
import { ApiError } from '../http/api-error';
import type { Auth, Session, User } from './lucia';
import { loadRoles } from './role-store';

export interface RequestAuth {
  user: User;
  session: Session;
  roles: RoleAssignment[];
}

export function authOf(res: Response): RequestAuth | undefined {
  return res.locals['auth'] as RequestAuth | undefined;
}

/** The signed-in user of this request, or a 401 that tells the official what to do. */
export function requireAuth(res: Response): RequestAuth {
  const auth = authOf(res);
  if (!auth) throw new ApiError('unauthenticated', 'You are not signed in, or your sign-in has ended. Sign in again.');
  return auth;
}

export function setSessionCookie(auth: Auth, res: Response, sessionId: string): void {
  res.append('Set-Cookie', auth.createSessionCookie(sessionId).serialize());
}

export function clearSessionCookie(auth: Auth, res: Response): void {
  res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
}

/**
 * Reads the session cookie on every API request (SPEC.md §2): a valid session puts the user and their
 * roles on the request and, when Lucia has extended it, sends the cookie again; a dead one is cleared.
 */
export function sessionReader(auth: Auth, db: Database): RequestHandler {
  return async (req: Request, res: Response, next) => {
    const sessionId = auth.readSessionCookie(req.headers.cookie ?? '');
    if (!sessionId) return next();
    const { session, user } = await auth.validateSession(sessionId);
    if (!session) {
      clearSessionCookie(auth, res);
      return next();
    }
    if (session.fresh) setSessionCookie(auth, res, session.id);
    res.locals['auth'] = { user, session, roles: await loadRoles(db, user.id) } satisfies RequestAuth;
    next();
  };
}
