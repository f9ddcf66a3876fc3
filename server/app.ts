import { existsSync } from 'node:fs';
import express from 'express';
import compression from 'compression';
import helmet from 'helmet';
import { createCsrf } from './auth/csrf';
import { createPassport } from './auth/passport';
import { absoluteSessionLimit, createSessionMiddleware, sameOriginGuard } from './auth/session';
import type { AppDeps } from './deps';
import { fileStore } from './storage/files';
import { s3FileStore } from './storage/s3-store';
import { clientFiles } from './http/client-files';
import { errorHandler, HttpError } from './http/errors';
import { hostAllowlist } from './http/host-allowlist';
import { inputGuard } from './http/input-guard';
import { LibraryCache } from './http/library-cache';
import { requestLog } from './http/request-log';
import { mountRoutes } from './http/route';
import { routeTable } from './routes';

/** Powerful browser features the app never uses, switched off for every page. */
const PERMISSIONS_POLICY =
  'camera=(), microphone=(), geolocation=(), payment=(), usb=(), serial=(), bluetooth=(), display-capture=(), interest-cohort=()';

/** Builds the Express app (API + built client) without listening, so tests can drive it directly. */
export function createApp(
  given: Omit<AppDeps, 'files' | 'auth' | 'library'> & Partial<Pick<AppDeps, 'files'>>,
) {
  const { config, pool, db, logger } = given;
  const passport = createPassport(db);
  const sessions = createSessionMiddleware(pool, config);
  const csrf = createCsrf(config);
  const deps: AppDeps = {
    ...given,
    files: given.files ?? (config.s3 ? s3FileStore(config.s3) : fileStore(config.uploadDir)),
    library: new LibraryCache(given.search),
    auth: { passport, sessions, csrf },
  };
  const app = express();
  app.disable('x-powered-by');
  // No hash of every API answer for a validator nobody may use (they are no-store); the answers
  // that may be revalidated set their own strong ETag (http/library-cache.ts), static files theirs.
  app.set('etag', false);
  app.set('trust proxy', config.trustProxy);
  app.use(hostAllowlist(config));
  const overTls = config.publicUrl.startsWith('https:');

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'default-src': ["'self'"],
          'base-uri': ["'none'"],
          'frame-ancestors': ["'none'"],
          'object-src': ["'none'"],
          'script-src': ["'self'"],
          'style-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'"],
          'connect-src': ["'self'"],
          'form-action': ["'self'"],
          'upgrade-insecure-requests': overTls ? [] : null,
        },
      },
      crossOriginEmbedderPolicy: false,
      // Over plain http a browser ignores HSTS, and sending it there only misleads.
      strictTransportSecurity: overTls ? { maxAge: 31_536_000, includeSubDomains: true } : false,
    }),
  );
  app.use((_req, res, next) => {
    res.set('Permissions-Policy', PERMISSIONS_POLICY);
    next();
  });
  app.use(requestLog(logger, { skip: (url) => url === '/api/health' }));

  const api = express.Router();
  // API answers carry people's names, runs and sessions: never kept by a browser or a proxy cache.
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  // Answers above 1 kB go compressed when the browser accepts it (not PDFs or images: not compressible).
  api.use(compression({ threshold: 1024 }));
  api.use(express.json({ limit: '2mb' }));
  api.use(inputGuard);
  api.use(sessions.middleware);
  api.use(absoluteSessionLimit(config));
  api.use(passport.session());
  api.use(sameOriginGuard(config));
  api.use(csrf.protection);
  mountRoutes(api, routeTable, deps);
  api.use((req, _res, next) => next(new HttpError(404, `No API route ${req.method} ${req.path}`)));
  app.use('/api', api);

  if (config.clientDir && existsSync(config.clientDir)) app.use(clientFiles(config.clientDir));

  app.use(errorHandler);
  // The app's dependencies (its owner closes deps.auth.sessions.store) and its API router, typed.
  return Object.assign(app, { deps, apiRouter: api });
}
