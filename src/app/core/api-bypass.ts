import type { HttpInterceptorFn } from '@angular/common/http';

/**
 * API calls go straight to the network: the service worker serves only the app shell, and a
 * worker-cached API answer would hide whether the server is really reachable.
 */
export const bypassServiceWorkerForApi: HttpInterceptorFn = (req, next) =>
  req.url.startsWith('/api/') ? next(req.clone({ setHeaders: { 'ngsw-bypass': 'true' } })) : next(req);
