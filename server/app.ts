import path from 'node:path';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express from 'express';
import helmet from 'helmet';
import type { Sequelize } from 'sequelize';
import { authRouter } from './auth/auth.routes';
import { authenticate } from './auth/authenticate';
import type { Config } from './config';
import { healthRouter } from './health/health.routes';
import type { Mailer } from './mail/mailer';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { createLimiters, type Limiters } from './middleware/rate-limit';
import { storableInput } from './middleware/storable-input';
import { createLogger, requestLogger, type Logger } from './logger';
import { callsRouter, myTrialsRouter } from './calls/calls.routes';
import { draftLinksRouter } from './drafts/drafts.routes';
import { photosRouter } from './photos/photos.routes';
import { myReportsRouter } from './reports/reports.routes';
import { invitationLinksRouter } from './invitations/invitations.routes';
import { mailLinksRouter } from './outbox/outbox.routes';
import { profileRouter } from './profile/profile.routes';
import { calendarFeedRouter, myDataRouter } from './me/me.routes';
import type { Storage } from './storage/storage';
import { studiosRouter } from './studios/studios.routes';
import { webApp } from './web/web-app';

export type AppDeps = {
  config: Config;
  sequelize: Sequelize;
  storage: Storage;
  mailer: Mailer;
  /** Where the request log and failures go (JSON lines on stdout unless given). */
  logger?: Logger;
};
/** What the routers get: the app's dependencies, its logger and the rate limits built from them. */
export type RouteDeps = AppDeps & { limiters: Limiters; logger: Logger };

function apiRouter(deps: RouteDeps): express.Router {
  const api = express.Router();
  // Answers carry people's own data (measurements, reports, sessions): no cache may keep them.
  api.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: '1mb' }));
  api.use(storableInput);
  api.use(cookieParser());
  api.use(authenticate(deps.config.auth));
  api.use('/health', healthRouter(deps));
  api.use('/auth', authRouter(deps));
  api.use('/studios', studiosRouter(deps));
  api.use('/invitations', invitationLinksRouter());
  api.use('/mail', mailLinksRouter(deps));
  api.use('/me', profileRouter());
  api.use('/me', myTrialsRouter(deps));
  api.use('/me', myDataRouter(deps));
  api.use('/calendar', calendarFeedRouter(deps));
  api.use('/calls', callsRouter(deps));
  api.use(draftLinksRouter(deps));
  api.use(photosRouter(deps));
  api.use(myReportsRouter());
  api.use(apiNotFound);
  return api;
}

export function createApp(deps: AppDeps): express.Express {
  const app = express();
  app.disable('x-powered-by');
  // Which proxies to believe about the client's address (TRUST_PROXY): rate limits key on it.
  app.set('trust proxy', deps.config.trustProxy);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // react-native-web writes its styles into <style> elements at run time.
          'style-src': ["'self'", "'unsafe-inline'"],
          // Photo thumbnails load straight from the object store through signed links.
          'img-src': ["'self'", 'data:', 'blob:', deps.config.s3.endpoint ? new URL(deps.config.s3.endpoint).origin : 'https://*.amazonaws.com'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          // Signed download links point at the object store's own origin.
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  const logger = deps.logger ?? createLogger();
  if (deps.config.logRequests) app.use(requestLogger(logger));
  // JSON answers compressed on the fly (Brotli or gzip); the web app's files were compressed at export.
  app.use('/api', compression({ threshold: 1024 }), apiRouter({ ...deps, logger, limiters: createLimiters(deps.sequelize, deps.config.limits) }));
  app.use(webApp(path.resolve(deps.config.webDist), deps.config.publicUrl));
  app.use(errorHandler(logger));
  return app;
}
