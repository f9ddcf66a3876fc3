import { existsSync } from 'node:fs';
import path from 'node:path';
import express from 'express';
import helmet from 'helmet';
import { createCsrf } from './auth/csrf';
import { createPassport } from './auth/passport';
import { absoluteSessionLimit, createSessionMiddleware, sameOriginGuard } from './auth/session';
import type { AppDeps } from './deps';
import { errorHandler, HttpError } from './http/errors';
import { requestLog } from './http/request-log';
import { mountRoutes } from './http/route';
import { routeTable } from './routes';

/** Builds the Express app (API + built client) without listening, so tests can drive it directly. */
export function createApp(deps: AppDeps) {
  const { config, pool, db, logger } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);

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
          'upgrade-insecure-requests': config.publicUrl.startsWith('https:') ? [] : null,
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(requestLog(logger, { skip: (url) => url === '/api/health' }));

  const passport = createPassport(db);
  const sessions = createSessionMiddleware(pool, config);
  app.locals.passport = passport;
  app.locals.sessionStore = sessions.store;
  const csrf = createCsrf(config);
  app.locals.csrf = csrf;
  app.locals.forgetSessionsOf = sessions.forgetSessionsOf;
  app.locals.sessionCookieName = config.publicUrl.startsWith('https:') ? '__Host-bw.sid' : 'bw.sid';

  const api = express.Router();
  api.use(express.json({ limit: '2mb' }));
  api.use(sessions.middleware);
  api.use(absoluteSessionLimit(config));
  api.use(passport.session());
  api.use(sameOriginGuard(config));
  api.use(csrf.protection);
  mountRoutes(api, routeTable, deps);
  api.use((req, _res, next) => next(new HttpError(404, `No API route ${req.method} ${req.path}`)));
  app.use('/api', api);
  app.locals.apiRouter = api;

  if (config.clientDir && existsSync(config.clientDir)) {
    const index = path.join(config.clientDir, 'index.html');
    app.use(express.static(config.clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes: every other GET gets the app shell.
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(index));
  }

  app.use(errorHandler);
  return app;
}
