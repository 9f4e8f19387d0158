import path from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import type { AppDeps } from './deps';
import { createLucia } from './auth/lucia';
import { loadSession } from './auth/middleware';
import { SessionCache } from './auth/session-cache';
import { originCheck } from './auth/origin';
import { apiNotFound, errorHandler } from './errors';
import { accountRouter } from './routes/account';
import { authRouter } from './routes/auth';
import { healthRouter } from './routes/health';
import { invitationsRouter } from './routes/invitations';
import { outboxRouter } from './routes/outbox';
import { peopleRouter } from './routes/people';
import { harnessesRouter } from './routes/harnesses';
import { modelsRouter } from './routes/models';
import { revisionsRouter } from './routes/revisions';
import { searchRouter } from './routes/search';
import { attachmentsRouter } from './routes/attachments';
import { customersRouter } from './routes/customers';
import { proceduresRouter } from './routes/procedures';
import { repairOrdersRouter } from './routes/repair-orders';
import { reportRouter } from './routes/report';
import { unitsRouter } from './routes/units';
import { readingsRouter } from './routes/readings';
import { busRouter } from './routes/bus';
import { startStalledChecks } from './orders/stalled';

/**
 * Routes that take JSON bodies over 2 MB: the global parser skips them and the route mounts
 * its own `express.json({ limit })`. Add a pattern here with the route.
 */
export const largeJsonRoutes: RegExp[] = [/^\/api\/harnesses\/import\/?$/, /^\/api\/revisions\/[^/]+\/document\/?$/];

export function createApp(deps: AppDeps): Express {
  const app = express();
  const { config } = deps;
  app.disable('x-powered-by');
  if (config.trustProxy !== false) app.set('trust proxy', config.trustProxy);

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // React and the drawing library set inline style attributes.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          workerSrc: ["'self'", 'blob:'],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          ...(config.secureCookies ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: config.secureCookies,
    }),
  );

  const json = express.json({ limit: '2mb' });
  app.use('/api', (req, res, next) => (largeJsonRoutes.some((r) => r.test(req.originalUrl.split('?')[0])) ? next() : json(req, res, next)));
  app.use('/api', (_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  app.use('/api', originCheck(config));
  const lucia = createLucia(deps.db, config);
  const sessionCache = new SessionCache(config.sessionCacheMs);
  app.use('/api', loadSession(deps, lucia, sessionCache));

  app.use('/api', healthRouter(deps));
  app.use('/api/auth', authRouter(deps, lucia, sessionCache));
  app.use('/api/invitations', invitationsRouter(deps, lucia, sessionCache));
  app.use('/api/people', peopleRouter(deps, lucia, sessionCache));
  app.use('/api/account', accountRouter(deps, lucia, sessionCache));
  app.use('/api/outbox', outboxRouter(deps));
  app.use('/api/models', modelsRouter(deps));
  app.use('/api/harnesses', harnessesRouter(deps));
  app.use('/api/revisions', revisionsRouter(deps));
  app.use('/api/search', searchRouter(deps));
  app.use('/api/customers', customersRouter(deps));
  app.use('/api/units', unitsRouter(deps));
  app.use('/api/procedures', proceduresRouter(deps));
  app.use('/api', attachmentsRouter(deps)); // /repair-orders/:id/attachments, /attachments/:id…
  app.use('/api', reportRouter(deps)); // /repair-orders/:id/report…, /links, /public/reports/:token…
  app.use('/api/repair-orders', repairOrdersRouter(deps));
  app.use('/api', busRouter(deps)); // /revisions/:id/messages…, /harnesses/:id/captures, /captures/:id…
  app.use('/api', readingsRouter(deps)); // /revisions/:id/evaluate, /reading-sets…, /connector-bookmarks…
  // The stalled-order e-mail check (tests call runStalledCheck themselves).
  if (config.nodeEnv !== 'test') startStalledChecks(deps);
  // Other resources: one line each, `app.use('/api/<resource>', <resource>Router(deps));`

  app.use('/api', apiNotFound);

  if (config.serveClient) {
    const dir = config.clientDir;
    app.use(express.static(dir, { index: false, maxAge: '1h', setHeaders: (res, file) => {
      if (file.includes(`${path.sep}assets${path.sep}`)) res.set('Cache-Control', 'public, max-age=31536000, immutable');
    } }));
    // The client's own routes: every other GET answers index.html.
    app.use((req, res, next) => {
      if ((req.method !== 'GET' && req.method !== 'HEAD') || req.path.startsWith('/api/')) return next();
      res.set('Cache-Control', 'no-cache');
      res.sendFile(path.join(dir, 'index.html'), (err) => err && next(err));
    });
  }

  app.use(errorHandler);
  return app;
}
