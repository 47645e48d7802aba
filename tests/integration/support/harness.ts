// Test harness for the API tests: a fresh trimwire_test schema per file, the app built by createApp,
// an in-process fake SMTP server on a free port (mail lands in the same database), and agents that
// fetch a CSRF token and sign in like the client does.
import request from 'supertest';
import type { Express } from 'express';
import { createApp } from '@/server/app';
import { hashPassword } from '@/server/auth/passwords';
import { createDb, type Db } from '@/server/db';
import { resetTestDatabase } from '@/server/db/reset';
import { DEMO_PASSWORD, seedDemo } from '@/server/db/seed';
import { LOCAL_DATABASE_URLS, loadEnv, type Env } from '@/server/env';
import { startFakeSmtp, type FakeSmtp } from '@/server/mail/fake-smtp';
import { createSmtpMailer, type Mailer } from '@/server/mail/mailer';
import type { Role } from '@/shared/domain/roles';
import type { ScanQueue } from '@/server/jobs/queue';

export const TEST_DATABASE_URL = process.env.DATABASE_URL?.endsWith('_test') ? process.env.DATABASE_URL : LOCAL_DATABASE_URLS.test;

export type Harness = {
  app: Express;
  env: Env;
  db: Db;
  smtp: FakeSmtp;
  demoTeamId: string;
  otherTeamId: string;
  close: () => Promise<void>;
};

export const OTHER_TEAM = { name: 'Harrow Signal Co.', admin: 'ops@harrow.test', member: 'bench@harrow.test' };

/** Fresh schema, demo seed plus a second team, app and fake SMTP. `env` overrides the defaults. */
export async function startHarness(env: Record<string, string> = {}): Promise<Harness> {
  const db = createDb(TEST_DATABASE_URL);
  await resetTestDatabase(db.sequelize);
  const smtp = await startFakeSmtp({ databaseUrl: TEST_DATABASE_URL, port: 0 });
  const fullEnv = loadEnv({
    NODE_ENV: 'test',
    DATABASE_URL: TEST_DATABASE_URL,
    SMTP_URL: `smtp://127.0.0.1:${smtp.port}`,
    PUBLIC_URL: 'http://127.0.0.1:8080',
    BCRYPT_COST: '4',
    RATE_LIMIT_SIGN_IN: '1000',
    RATE_LIMIT_MAIL: '1000',
    DIST_DIR: '/nonexistent-trimwire-dist',
    ...env,
  });
  const { teamId } = await seedDemo(db, { nodeEnv: 'test', bcryptCost: 4 });
  const other = await db.models.Team.create({ name: OTHER_TEAM.name });
  await addMember(db, other.id, OTHER_TEAM.admin, 'admin');
  await addMember(db, other.id, OTHER_TEAM.member, 'designer');
  const mailer: Mailer = createSmtpMailer(fullEnv.SMTP_URL, fullEnv.MAIL_FROM);
  const app = createApp({ env: fullEnv, db, mailer, log: () => undefined });
  return {
    app,
    env: fullEnv,
    db,
    smtp,
    demoTeamId: teamId,
    otherTeamId: other.id,
    close: async () => {
      await (app.locals.scanQueue as ScanQueue | undefined)?.close();
      mailer.close();
      await smtp.close();
      await db.close();
    },
  };
}

let counter = 0;
/** Adds a person with the demo password to a team; returns their user id. */
export async function addMember(db: Db, teamId: string, email: string | undefined, role: Role): Promise<string> {
  const address = email ?? `member-${Date.now()}-${++counter}@trimwire.test`;
  const [user] = await db.models.User.findOrCreate({
    where: { email: address },
    defaults: { email: address, name: `Member ${counter}`, passwordHash: await hashPassword(DEMO_PASSWORD, 4) },
  });
  await db.models.Membership.create({ teamId, userId: user.id, role });
  return user.id;
}

export type Client = {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
};

/** A browser-like client: its own cookie jar and the session's CSRF token. */
export async function newClient(app: Express): Promise<Client> {
  const agent = request.agent(app);
  const res = await agent.get('/api/auth/csrf').expect(200);
  return { agent, csrf: res.body.csrfToken as string };
}

export async function signIn(app: Express, email: string, password = DEMO_PASSWORD): Promise<Client> {
  const client = await newClient(app);
  await client.agent.post('/api/auth/sign-in').set('X-CSRF-Token', client.csrf).send({ email, password }).expect(200);
  return client;
}

export function roleEmail(role: Role): string {
  return `${role}@trimwire.test`;
}

/** Mail the fake SMTP server stored for one address, newest first. */
export async function mailTo(db: Db, address: string) {
  return db.models.OutboxMessage.findAll({ where: { toAddress: address }, order: [['receivedAt', 'DESC']] });
}

export function tokenFromMail(text: string): string {
  const m = /set-password\?token=([A-Za-z0-9_%-]+)/.exec(text);
  if (!m) throw new Error(`no set-password link in mail:\n${text}`);
  return decodeURIComponent(m[1]!);
}
