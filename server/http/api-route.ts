import type { RequestHandler, Router } from 'express';
import { guard, type Access } from '../auth/access';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** One API route: the only way routes are added, so each declares who may call it. */
export interface ApiRoute {
  method: HttpMethod;
  /** Path under /api, e.g. "/competitions/:id/rules-profile". */
  path: string;
  access: Access;
  handle: RequestHandler;
}

export function mountRoutes(router: Router, routes: readonly ApiRoute[]): void {
  for (const route of routes) router[route.method](route.path, guard(route.access), route.handle);
}
