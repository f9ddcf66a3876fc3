import path from 'node:path';
import express from 'express';
import expressStaticGzip from 'express-static-gzip';

/** Vite's output folder for hashed files: a changed file gets a new name, so these never change. */
const HASHED = `${path.sep}assets${path.sep}`;
export const IMMUTABLE = 'public, max-age=31536000, immutable';

/**
 * The built client: the brotli or gzip copy made at build time when the browser accepts it (with
 * `Vary: Accept-Encoding`), hashed files cached for a year, and every other address given the app
 * shell, which the browser checks again on each visit (`no-cache`) so a new build is seen at once.
 */
export function clientFiles(clientDir: string) {
  const root = path.resolve(clientDir);
  const router = express.Router();
  router.use(
    expressStaticGzip(root, {
      enableBrotli: true,
      orderPreference: ['br', 'gzip'],
      index: false,
      serveStatic: {
        index: false,
        setHeaders: (res, file) =>
          res.setHeader('Cache-Control', file.startsWith(root + HASHED) ? IMMUTABLE : 'no-cache'),
      },
    }),
  );
  // Client-side routes: every other GET gets the app shell. Relative to root: send's dotfile rule then
  // looks at "index.html" only, so a checkout under a folder whose name starts with a dot still serves.
  router.get(/^(?!\/api\/).*/, (_req, res) =>
    res.sendFile('index.html', { root, headers: { 'Cache-Control': 'no-cache' } }),
  );
  return router;
}
