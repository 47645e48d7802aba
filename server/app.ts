// createApp builds the Express app (API + web build) from its dependencies; it never listens, so
// tests and the server entry point can start it however they like.
import express, { type Express } from 'express';
import type { Db } from '@/server/db';
import type { Env } from '@/server/env';
import type { Mailer } from '@/server/mail/mailer';
import type { AppDeps } from '@/server/deps';
import { createPassport } from '@/server/auth/passport';
import { createSessionMiddleware } from '@/server/auth/session';
import { requireCsrf } from '@/server/http/csrf';
import { apiNotFound, createErrorHandler } from '@/server/http/error-handler';
import { createRateLimits } from '@/server/http/rate-limits';
import { securityHeaders } from '@/server/http/security';
import { accountRouter } from '@/server/features/account/router';
import { auditRouter } from '@/server/features/audit/router';
import { authRouter } from '@/server/features/auth/router';
import { healthRouter } from '@/server/features/health/router';
import { lessonsRouter } from '@/server/features/lessons/router';
import { shareRouter } from '@/server/features/share/router';
import { outboxRouter } from '@/server/features/outbox/router';
import { teamRouter } from '@/server/features/team/router';
import { webRouter } from '@/server/web';
import { assumptionsRouter } from '@/server/features/assumptions/router';
import { boardsRouter } from '@/server/features/boards/router';
import { designsRouter } from '@/server/features/designs/router';
import { exportsRouter } from '@/server/features/exports/router';
import { proposalsRouter } from '@/server/features/proposals/router';
import { picturesRouter } from '@/server/features/pictures/router';
import { reviewRouter } from '@/server/features/review/router';
import { revisionsRouter } from '@/server/features/revisions/router';
import { scansRouter } from '@/server/features/scans/router';
import { createScanQueue, type ScanQueue } from '@/server/jobs/queue';

/** Largest JSON body the API reads; larger ones get 413. */
export const JSON_BODY_LIMIT = '100kb';

export type CreateAppOptions = {
  env: Env;
  db: Db;
  mailer: Mailer;
  /** Where unexpected errors are reported (tests silence or capture it). */
  log?: (msg: string, err: unknown) => void;
  /** Where scans are queued; by default pg-boss in the same database, started on first use and
   * kept on app.locals.scanQueue so whoever owns the app can close it. */
  queue?: ScanQueue;
};

export function createApp({ env, db, mailer, log, queue }: CreateAppOptions): Express {
  const production = env.NODE_ENV === 'production';
  const app = express();
  app.disable('x-powered-by');
  if (env.TRUST_PROXY > 0) app.set('trust proxy', env.TRUST_PROXY);

  const limits = createRateLimits({ signInLimit: env.RATE_LIMIT_SIGN_IN, mailLimit: env.RATE_LIMIT_MAIL });
  const deps: AppDeps = { env, db, mailer, limits };
  const scanQueue = queue ?? createScanQueue(env.DATABASE_URL, log);
  app.locals.scanQueue = scanQueue;
  const passport = createPassport(db, env.BCRYPT_COST);

  app.use(securityHeaders(production));

  const api = express.Router();
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: JSON_BODY_LIMIT, strict: true }));
  api.use(createSessionMiddleware({ pool: db.pool, secret: env.SESSION_SECRET, production }));
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(requireCsrf);
  api.use('/health', healthRouter(deps));
  api.use('/auth', authRouter(deps, passport));
  api.use('/team/outbox', outboxRouter(deps));
  api.use('/team', teamRouter(deps));
  api.use('/account', accountRouter(deps));
  api.use('/audit', auditRouter(deps));
  api.use('/share', shareRouter(deps));
  api.use(lessonsRouter(deps));
  // Review workflow: each router names its full paths under /api.
  api.use(designsRouter(deps));
  api.use(revisionsRouter(deps));
  api.use(exportsRouter(deps));
  api.use(boardsRouter(deps));
  api.use(assumptionsRouter(deps));
  api.use(scansRouter({ ...deps, queue: scanQueue }));
  api.use(proposalsRouter(deps));
  api.use(picturesRouter(deps));
  api.use(reviewRouter(deps));
  api.use(apiNotFound);

  app.use('/api', api);
  app.use(webRouter(env.DIST_DIR));
  app.use(createErrorHandler(log));
  return app;
}
