import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import session from 'express-session';
import helmet from 'helmet';
import type pg from 'pg';
import type { Config } from './lib/config';
import { AppError, errorHandler, notFoundHandler } from './lib/errors';
import { requestLog } from './lib/request-log';
import { BatchedPgStore } from './lib/session-store';
import { auditRouter } from './modules/audit/audit.routes';
import { authRouter } from './modules/auth/auth.routes';
import { datasetsRouter } from './modules/datasets/datasets.routes';
import { mailboxRouter } from './modules/dev/mailbox.routes';
import { healthRouter } from './modules/health/health.routes';
import { modelsRouter } from './modules/models/models.routes';
import { policyRouter } from './modules/policy/policy.routes';
import { reviewRouter } from './modules/review/review.routes';
import { teamsRouter } from './modules/teams/teams.routes';

export type AppOptions = { config: Config; sessionPool: pg.Pool; mailSink: boolean };

/**
 * State-changing requests must come from our own pages: a browser always sends Origin on a
 * cross-site POST, and Sec-Fetch-Site tells the rest. Non-browser clients send neither.
 */
function sameOriginOnly(appUrl: string): RequestHandler {
  const ownOrigin = new URL(appUrl).origin;
  return (req, _res, next) => {
    if (['GET', 'HEAD', 'OPTIONS'].includes(req.method)) return next();
    const origin = req.get('origin');
    const site = req.get('sec-fetch-site');
    if ((origin && origin !== ownOrigin) || site === 'cross-site') {
      return next(
        new AppError('cross_site_request', 403, 'This request came from another site and was refused.'),
      );
    }
    next();
  };
}

export function createApp({ config, sessionPool, mailSink }: AppOptions): express.Express {
  const app = express();
  app.disable('x-powered-by');
  // No ETag on API answers: they are per user and mostly no-store, and hashing every body for a
  // revalidation no one makes cost CPU on the hottest reads. Static files keep theirs.
  app.set('etag', false);
  // TRUST_PROXY=1 means one hop: Express reads the string "1" as an address, so pass a number.
  if (config.trustProxy)
    app.set('trust proxy', /^\d+$/.test(config.trustProxy) ? Number(config.trustProxy) : config.trustProxy);

  app.use(requestLog({ ignore: (path) => path === '/api/health' }));
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'"],
          'img-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          'form-action': ["'self'", new URL(config.oidc.issuer).origin],
          'frame-ancestors': ["'none'"],
          'upgrade-insecure-requests': config.production ? [] : null,
        },
      },
      strictTransportSecurity: config.production,
    }),
  );

  // Health needs no session: it must answer even while PostgreSQL is down.
  app.use(healthRouter());

  app.use(express.json({ limit: '1mb' }));
  app.use(
    session({
      name: 'coppice.sid',
      secret: config.sessionSecret,
      store: new BatchedPgStore({ pool: sessionPool, tableName: 'session', pruneSessionInterval: 600 }),
      resave: false,
      saveUninitialized: false,
      // A session lasts 8 hours from sign-in; not rewriting it on every request keeps reads cheap.
      rolling: false,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: config.production ? true : 'auto',
        maxAge: 8 * 60 * 60 * 1000,
        path: '/',
      },
    }),
  );
  app.use(sameOriginOnly(config.appUrl));
  app.use(
    '/auth',
    rateLimit({
      windowMs: 60_000,
      limit: Number(process.env.AUTH_RATE_LIMIT ?? 300),
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_req, res) => {
        res.status(429).json({
          error: { code: 'too_many_requests', message: 'Too many sign-in attempts; wait a minute.' },
        });
      },
    }),
  );

  app.use(authRouter(config));
  // Feature routers, one line each. Every request walks them in order until a route matches, so
  // the managers' reads (team briefs, the busiest by far) come first.
  app.use(teamsRouter(config));
  app.use(policyRouter());
  app.use(auditRouter());
  app.use(reviewRouter());
  app.use(datasetsRouter(config));
  app.use(modelsRouter(config));
  if (mailSink && !config.production) app.use(mailboxRouter());

  app.use('/api', notFoundHandler);
  app.use('/auth', notFoundHandler);

  const webRoot = path.resolve('dist/web');
  if (existsSync(path.join(webRoot, 'index.html'))) {
    app.use(express.static(webRoot, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => {
      res.sendFile(path.join(webRoot, 'index.html'));
    });
  } else {
    app.get('/{*splat}', (_req, res) => {
      res
        .status(503)
        .type('text')
        .send('The Coppice web app is not built yet: run `npm run build` (npm start does it).');
    });
  }

  app.use(errorHandler);
  return app;
}
