// Web security basics: CSRF refusal, rate limits on sign-in and on mail-sending routes, and bad
// input (malformed JSON, wrong types, unknown fields, oversized bodies) → 400/413 with the error
// body, never a 500.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@/shared/api/error';
import { newClient, signIn, startHarness, type Harness } from './support/harness';

function expectErrorBody(body: unknown, code: string): void {
  const parsed = ErrorBodySchema.safeParse(body);
  expect(parsed.success, JSON.stringify(body)).toBe(true);
  expect(parsed.data!.error.code).toBe(code);
  expect(parsed.data!.error.message.length).toBeGreaterThan(0);
}

describe('CSRF', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(async () => {
    await h.close();
  });

  it('refuses a state-changing request without the token, with a wrong one, or with another session’s', async () => {
    const c = await newClient(h.app);
    const other = await newClient(h.app);
    const body = { email: 'admin@trimwire.test', password: 'trimwire-demo' };
    const none = await c.agent.post('/api/auth/sign-in').send(body);
    expect(none.status).toBe(403);
    expectErrorBody(none.body, 'csrf');
    const wrong = await c.agent.post('/api/auth/sign-in').set('X-CSRF-Token', 'x'.repeat(43)).send(body);
    expect(wrong.status).toBe(403);
    expectErrorBody(wrong.body, 'csrf');
    const foreign = await c.agent.post('/api/auth/sign-in').set('X-CSRF-Token', other.csrf).send(body);
    expect(foreign.status).toBe(403);
    await c.agent.post('/api/auth/sign-in').set('X-CSRF-Token', c.csrf).send(body).expect(200);
  });

  it('protects signed-in changes too, and the token survives signing in', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const res = await admin.agent.patch('/api/account').send({ name: 'Nobody' });
    expect(res.status).toBe(403);
    expectErrorBody(res.body, 'csrf');
    const ok = await admin.agent.patch('/api/account').set('X-CSRF-Token', admin.csrf).send({ name: 'Maren O.' });
    expect(ok.status).toBe(200);
    expect(ok.body.user.name).toBe('Maren O.');
  });

  it('a request with no session cookie at all is refused', async () => {
    const { default: request } = await import('supertest');
    const res = await request(h.app).post('/api/auth/sign-out').set('X-CSRF-Token', 'anything');
    expect(res.status).toBe(403);
    expectErrorBody(res.body, 'csrf');
  });

  it('session cookie is httpOnly and SameSite=Lax; helmet headers are set', async () => {
    const { default: request } = await import('supertest');
    const res = await request(h.app).get('/api/auth/csrf').expect(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});

describe('rate limits', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness({ RATE_LIMIT_SIGN_IN: '3', RATE_LIMIT_MAIL: '2' });
  });
  afterAll(async () => {
    await h.close();
  });

  it('repeated bad sign-ins are limited, then even the right password waits', async () => {
    const c = await newClient(h.app);
    const attempt = (password: string) =>
      c.agent.post('/api/auth/sign-in').set('X-CSRF-Token', c.csrf).send({ email: 'reviewer@trimwire.test', password });
    for (let i = 0; i < 3; i++) expect((await attempt(`wrong-${i}`)).status).toBe(401);
    const limited = await attempt('wrong-again');
    expect(limited.status).toBe(429);
    expectErrorBody(limited.body, 'rate-limited');
    expect((await attempt('trimwire-demo')).status).toBe(429);
  });

  it('failed sign-ins are in the audit log', async () => {
    const entries = await h.db.models.AuditEntry.findAll({ where: { action: 'sign-in-failed', target: 'reviewer@trimwire.test' } });
    expect(entries.length).toBeGreaterThanOrEqual(3);
  });

  it('password-reset requests are limited', async () => {
    const c = await newClient(h.app);
    const ask = () => c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'nobody@example.test' });
    expect((await ask()).status).toBe(202);
    expect((await ask()).status).toBe(202);
    const limited = await ask();
    expect(limited.status).toBe(429);
    expectErrorBody(limited.body, 'rate-limited');
  });
});

describe('bad input', () => {
  let h: Harness;
  let admin: Awaited<ReturnType<typeof signIn>>;
  beforeAll(async () => {
    h = await startHarness();
    admin = await signIn(h.app, 'admin@trimwire.test');
  });
  afterAll(async () => {
    await h.close();
  });

  const post = (path: string) => admin.agent.post(path).set('X-CSRF-Token', admin.csrf);

  it('malformed JSON → 400 malformed-json', async () => {
    const res = await post('/api/team/invites').set('Content-Type', 'application/json').send('{"email": "a@b.test", "role": ');
    expect(res.status).toBe(400);
    expectErrorBody(res.body, 'malformed-json');
  });

  it('a JSON scalar or array where an object belongs → 400', async () => {
    for (const raw of ['"text"', '[1,2]', 'null', '42']) {
      const res = await post('/api/team/invites').set('Content-Type', 'application/json').send(raw);
      expect(res.status, raw).toBe(400);
      expect(ErrorBodySchema.safeParse(res.body).success).toBe(true);
    }
  });

  it('wrong types → 400 naming the fields', async () => {
    const res = await post('/api/team/invites').send({ email: 42, role: 'overlord' });
    expect(res.status).toBe(400);
    expectErrorBody(res.body, 'bad-request');
    const paths = res.body.error.details.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['body.email', 'body.role']));
  });

  it('unknown fields → 400', async () => {
    const res = await post('/api/team/invites').send({ email: 'x@example.test', role: 'viewer', isAdmin: true });
    expect(res.status).toBe(400);
    expectErrorBody(res.body, 'bad-request');
    const account = await admin.agent.patch('/api/account').set('X-CSRF-Token', admin.csrf).send({ notifications: { decisions: true, spam: true } });
    expect(account.status).toBe(400);
  });

  it('a body on a route that takes none, and unknown query parameters → 400', async () => {
    const signOut = await post('/api/auth/sign-out').send({ everywhere: true });
    expect(signOut.status).toBe(400);
    const q = await admin.agent.get('/api/team?include=secrets');
    expect(q.status).toBe(400);
    expectErrorBody(q.body, 'bad-request');
  });

  it('a malformed id in the path → 400, not 500', async () => {
    const res = await admin.agent.patch('/api/team/members/not-a-uuid').set('X-CSRF-Token', admin.csrf).send({ role: 'viewer' });
    expect(res.status).toBe(400);
    expectErrorBody(res.body, 'bad-request');
  });

  it('an oversized body → 413 too-large', async () => {
    const res = await post('/api/team/invites').send({ email: 'x@example.test', role: 'viewer', pad: 'x'.repeat(300_000) });
    expect(res.status).toBe(413);
    expectErrorBody(res.body, 'too-large');
  });

  it('a body that is not JSON → 400', async () => {
    const res = await post('/api/team/invites').set('Content-Type', 'text/plain').send('email=x@example.test');
    expect(res.status).toBe(400);
    expectErrorBody(res.body, 'bad-request');
  });

  it('an unsupported charset → 415 with the error body', async () => {
    const res = await post('/api/team/invites').set('Content-Type', 'application/json; charset=klingon').send('{}');
    expect(res.status).toBe(415);
    expect(ErrorBodySchema.safeParse(res.body).success).toBe(true);
  });
});
