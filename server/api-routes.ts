import { authRoutes, type AuthRouteDeps } from './auth/auth-routes';
import type { ApiRoute } from './http/api-route';
import { competitionRoutes } from './routes/competitions';
import { healthRoutes } from './routes/health';

export type ApiDeps = AuthRouteDeps;

/** Every API route, each with the access it declares; the authorisation matrix test walks this list. */
export function apiRoutes(deps: ApiDeps): ApiRoute[] {
  return [...healthRoutes(deps.db), ...competitionRoutes(deps.db), ...authRoutes(deps)];
}
