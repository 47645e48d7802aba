// Sessions kept in PostgreSQL (connect-pg-simple), with an httpOnly, SameSite=Lax cookie that is
// secure in production.
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import type pg from 'pg';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
    /** The team the person is working in (they may belong to several). */
    teamId?: string;
  }
}

export const SESSION_COOKIE = 'trimwire.sid';
const TWO_WEEKS_MS = 14 * 24 * 60 * 60 * 1000;

export function createSessionMiddleware(opts: { pool: pg.Pool; secret: string; production: boolean }): RequestHandler {
  const PgStore = connectPgSimple(session);
  return session({
    name: SESSION_COOKIE,
    secret: opts.secret,
    // The table comes from the migrations, so the store never creates it.
    store: new PgStore({ pool: opts.pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: opts.production, maxAge: TWO_WEEKS_MS },
  });
}
