// startServer: connects the database and mailer, builds the app and listens. Used by the entry
// point and by end-to-end tests (any port; port 0 picks a free one). close() stops it cleanly.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '@/server/app';
import { createDb, type Db } from '@/server/db';
import { loadEnv, type Env } from '@/server/env';
import { createSmtpMailer, type Mailer } from '@/server/mail/mailer';
import type { ScanQueue } from '@/server/jobs/queue';

export type RunningServer = {
  url: string;
  port: number;
  env: Env;
  db: Db;
  close: () => Promise<void>;
};

export type StartServerOptions = {
  /** Overrides of environment variables (e.g. { PORT: '0', DATABASE_URL: … }). */
  env?: Record<string, string | undefined>;
  port?: number;
  host?: string;
  mailer?: Mailer;
};

export async function startServer(opts: StartServerOptions = {}): Promise<RunningServer> {
  const base = loadEnv({ ...process.env, ...opts.env });
  const env: Env = { ...base, PORT: opts.port ?? base.PORT, HOST: opts.host ?? base.HOST };
  const db = createDb(env.DATABASE_URL);
  const mailer = opts.mailer ?? createSmtpMailer(env.SMTP_URL, env.MAIL_FROM);
  const app = createApp({ env, db, mailer });
  const server = http.createServer(app);
  // Keep-alive sockets would hold close() open; let them idle out quickly.
  server.keepAliveTimeout = 5_000;
  try {
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(env.PORT, env.HOST, () => resolve());
    });
  } catch (err) {
    mailer.close();
    await db.close();
    throw err;
  }
  const port = (server.address() as AddressInfo).port;
  let closing: Promise<void> | undefined;
  return {
    url: `http://${env.HOST}:${port}`,
    port,
    env,
    db,
    close: () =>
      (closing ??= (async () => {
        await new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeIdleConnections();
        });
        mailer.close();
        await (app.locals.scanQueue as ScanQueue | undefined)?.close();
        await db.close();
      })()),
  };
}
