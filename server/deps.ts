// What createApp hands every feature router: configuration, database, mailer and rate limits.
import type { Db } from '@/server/db';
import type { Env } from '@/server/env';
import type { RateLimits } from '@/server/http/rate-limits';
import type { Mailer } from '@/server/mail/mailer';

export type AppDeps = {
  env: Env;
  db: Db;
  mailer: Mailer;
  limits: RateLimits;
};
