import type { Request, RequestHandler } from 'express';
import { hasRole, type Role } from '../../shared/auth/roles';
import { ApiError } from '../http/api-error';
import { requireAuth } from './request-auth';

/** Who may call an API route (SPEC.md §5). Every route declares one; the authorisation test reads them. */
export type Access =
  | { kind: 'public' }
  | { kind: 'signed-in' }
  /** One of the roles in the competition the request names (global organisers count everywhere). */
  | { kind: 'competition-role'; roles: Role[]; competitionId: (req: Request) => unknown }
  /** One of the roles in any competition, or globally. */
  | { kind: 'any-role'; roles: Role[] };

export const publicAccess: Access = { kind: 'public' };
export const signedIn: Access = { kind: 'signed-in' };
export const competitionRole = (roles: Role[], competitionId: (req: Request) => unknown): Access => ({
  kind: 'competition-role',
  roles,
  competitionId,
});
export const anyRole = (roles: Role[]): Access => ({ kind: 'any-role', roles });
export const competitionInPath = (req: Request): unknown => req.params['id'];

export function guard(access: Access): RequestHandler {
  return (req, res, next) => {
    if (access.kind === 'public') return next();
    const { roles } = requireAuth(res);
    if (access.kind === 'competition-role') {
      const competitionId = access.competitionId(req);
      const id = typeof competitionId === 'string' || competitionId === null ? competitionId : undefined;
      if (id === undefined || !hasRole(roles, id, ...access.roles)) throw forbidden();
    }
    if (access.kind === 'any-role' && !roles.some((r) => access.roles.includes(r.role))) throw forbidden();
    next();
  };
}

const forbidden = () => new ApiError('forbidden', 'Your role in this competition does not allow this. Ask the area leader or the organiser.');
