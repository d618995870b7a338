import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Router } from 'express';

// The service worker decides freshness by comparing hashes in ngsw.json; these files must never be
// served from an HTTP cache, or a device keeps an old shell forever.
const alwaysRevalidate = new Set([
  'index.html',
  'ngsw.json',
  'ngsw-worker.js',
  'safety-worker.js',
  'worker-basic.min.js',
  'manifest.webmanifest',
]);

// Output hashing puts a content hash in these names, so they can be cached for good.
const hashedName = /-[A-Z0-9]{8,}\.(js|css|woff2?)$/;

/** Serves the built Angular app: static files plus index.html for every in-app route. */
export function clientFiles(clientDir: string): Router {
  const router = express.Router();
  const indexFile = path.join(clientDir, 'index.html');
  router.use(
    express.static(clientDir, {
      index: false,
      setHeaders(res, filePath) {
        const name = path.basename(filePath);
        if (alwaysRevalidate.has(name)) res.setHeader('Cache-Control', 'no-cache');
        else if (hashedName.test(name)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        else res.setHeader('Cache-Control', 'no-cache');
      },
    }),
  );
  router.get(/^(?!\/api(\/|$)).*/, (req, res, next) => {
    // A path with a dot in its last segment is a missing file, not an in-app route.
    if (path.extname(req.path) !== '' || !existsSync(indexFile)) {
      next();
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
  return router;
}
