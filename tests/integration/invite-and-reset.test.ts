// E-mailed links end to end: an admin's invite is captured by the fake SMTP server, the link sets a
// password and signs in; password resets; every token works once and expires.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MeSchema } from '@/shared/api/auth';
import { OutboxResponseSchema } from '@/shared/api/team';
import { INVITE_TTL_MS, RESET_TTL_MS } from '@/server/auth/tokens';
import { DEMO_PASSWORD } from '@/server/db/seed';
import { mailTo, newClient, signIn, startHarness, tokenFromMail, type Harness } from './support/harness';

describe('invites and password resets', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(async () => {
    await h.close();
  });

  it('invite → mail captured by the fake SMTP server → set password → sign in', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const sent = await admin.agent
      .post('/api/team/invites')
      .set('X-CSRF-Token', admin.csrf)
      .send({ email: 'Wynn.Aster@Example.test', role: 'reviewer' })
      .expect(201);
    expect(sent.body).toMatchObject({ email: 'wynn.aster@example.test', role: 'reviewer' });
    const ttl = Date.parse(sent.body.expiresAt) - Date.now();
    expect(ttl).toBeGreaterThan(INVITE_TTL_MS - 60_000);
    expect(ttl).toBeLessThanOrEqual(INVITE_TTL_MS);

    // The admin sees the message on the outbox and the pending invite on the team.
    const outbox = await admin.agent.get('/api/team/outbox').expect(200);
    const messages = OutboxResponseSchema.parse(outbox.body).messages;
    const mail = messages.find((m) => m.to.includes('wynn.aster@example.test'));
    expect(mail?.subject).toContain('Larkspur Relay Works');
    expect(mail?.text).toContain('http://127.0.0.1:8080/set-password?token=');
    const team = await admin.agent.get('/api/team').expect(200);
    expect(team.body.invites.map((i: { email: string }) => i.email)).toContain('wynn.aster@example.test');

    const token = tokenFromMail(mail!.text);
    const invitee = await newClient(h.app);
    const set = await invitee.agent
      .post('/api/auth/set-password')
      .set('X-CSRF-Token', invitee.csrf)
      .send({ token, password: 'wren-eight-bus-driver' })
      .expect(200);
    const me = MeSchema.parse(set.body);
    expect(me.user.email).toBe('wynn.aster@example.test');
    expect(me.role).toBe('reviewer');
    expect(me.team.id).toBe(h.demoTeamId);
    await invitee.agent.get('/api/auth/me').expect(200);

    // A fresh sign-in with the chosen password works; the invite is no longer pending.
    const again = await signIn(h.app, 'wynn.aster@example.test', 'wren-eight-bus-driver');
    const me2 = await again.agent.get('/api/auth/me').expect(200);
    expect(me2.body.role).toBe('reviewer');
    const team2 = await admin.agent.get('/api/team').expect(200);
    expect(team2.body.invites.map((i: { email: string }) => i.email)).not.toContain('wynn.aster@example.test');
    expect(team2.body.members.map((m: { email: string }) => m.email)).toContain('wynn.aster@example.test');

    // The token was single use.
    const reuse = await newClient(h.app);
    const res = await reuse.agent.post('/api/auth/set-password').set('X-CSRF-Token', reuse.csrf).send({ token, password: 'another-long-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('token-invalid');
  });

  it('inviting someone who is already a member is a conflict', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const res = await admin.agent.post('/api/team/invites').set('X-CSRF-Token', admin.csrf).send({ email: 'designer@trimwire.test', role: 'viewer' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('already-member');
  });

  it('a revoked invite link does not work', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const sent = await admin.agent.post('/api/team/invites').set('X-CSRF-Token', admin.csrf).send({ email: 'revoked@example.test', role: 'viewer' }).expect(201);
    const [mail] = await mailTo(h.db, 'revoked@example.test');
    await admin.agent.delete(`/api/team/invites/${sent.body.id}`).set('X-CSRF-Token', admin.csrf).expect(204);
    const c = await newClient(h.app);
    const res = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token: tokenFromMail(mail!.text), password: 'long-enough-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('token-invalid');
  });

  it('an expired invite link does not work', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const sent = await admin.agent.post('/api/team/invites').set('X-CSRF-Token', admin.csrf).send({ email: 'late@example.test', role: 'viewer' }).expect(201);
    const [mail] = await mailTo(h.db, 'late@example.test');
    await h.db.models.Token.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: sent.body.id } });
    const c = await newClient(h.app);
    const res = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token: tokenFromMail(mail!.text), password: 'long-enough-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('token-invalid');
    expect(await h.db.models.User.findOne({ where: { email: 'late@example.test' } })).toBeNull();
  });

  it('password reset: mail only for a real account, new password works, old one stops working', async () => {
    const c = await newClient(h.app);
    await c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'nobody@example.test' }).expect(202);
    expect(await mailTo(h.db, 'nobody@example.test')).toHaveLength(0);

    await c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'Viewer@trimwire.test' }).expect(202);
    const [mail] = await mailTo(h.db, 'viewer@trimwire.test');
    expect(mail?.subject).toMatch(/reset/i);
    const row = await h.db.models.Token.findOne({ where: { kind: 'reset', email: 'viewer@trimwire.test', usedAt: null } });
    const ttl = row!.expiresAt.getTime() - Date.now();
    expect(ttl).toBeGreaterThan(RESET_TTL_MS - 60_000);
    expect(ttl).toBeLessThanOrEqual(RESET_TTL_MS);

    const token = tokenFromMail(mail!.text);
    const set = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token, password: 'wren-eight-new-secret' }).expect(200);
    expect(set.body.user.email).toBe('viewer@trimwire.test');
    expect(set.body.role).toBe('viewer');

    await signIn(h.app, 'viewer@trimwire.test', 'wren-eight-new-secret');
    const old = await newClient(h.app);
    const bad = await old.agent.post('/api/auth/sign-in').set('X-CSRF-Token', old.csrf).send({ email: 'viewer@trimwire.test', password: DEMO_PASSWORD });
    expect(bad.status).toBe(401);
    expect(bad.body.error.code).toBe('bad-credentials');

    const reuse = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token, password: 'yet-another-secret' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.error.code).toBe('token-invalid');
  });

  it('a second reset request makes the first link useless; an expired reset link fails', async () => {
    const c = await newClient(h.app);
    await c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'educator@trimwire.test' }).expect(202);
    const [first] = await mailTo(h.db, 'educator@trimwire.test');
    await c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'educator@trimwire.test' }).expect(202);
    const mails = await mailTo(h.db, 'educator@trimwire.test');
    expect(mails).toHaveLength(2);
    const firstToken = tokenFromMail(first!.text);
    const secondToken = tokenFromMail(mails.find((m) => m.id !== first!.id)!.text);
    expect(secondToken).not.toBe(firstToken);

    const r1 = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token: firstToken, password: 'long-enough-password' });
    expect(r1.status).toBe(400);

    await h.db.models.Token.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { kind: 'reset', email: 'educator@trimwire.test', usedAt: null } });
    const r2 = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token: secondToken, password: 'long-enough-password' });
    expect(r2.status).toBe(400);
    expect(r2.body.error.code).toBe('token-invalid');
  });

  it('a too-short password is refused before the token is spent', async () => {
    const c = await newClient(h.app);
    await c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'designer@trimwire.test' }).expect(202);
    const [mail] = await mailTo(h.db, 'designer@trimwire.test');
    const token = tokenFromMail(mail!.text);
    const short = await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token, password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details.issues[0].path).toBe('body.password');
    await c.agent.post('/api/auth/set-password').set('X-CSRF-Token', c.csrf).send({ token, password: 'long-enough-password' }).expect(200);
  });
});

describe('when the mail server is unreachable', () => {
  let h: Harness;
  beforeAll(async () => {
    // Port 1: connection refused, as when the SMTP server is down.
    h = await startHarness({ SMTP_URL: 'smtp://127.0.0.1:1' });
  });
  afterAll(async () => {
    await h.close();
  });

  it('an invite answers 503 and leaves no dead invite behind', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const res = await admin.agent.post('/api/team/invites').set('X-CSRF-Token', admin.csrf).send({ email: 'lost@example.test', role: 'viewer' });
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('unavailable');
    expect(await h.db.models.Token.count({ where: { email: 'lost@example.test' } })).toBe(0);
  });

  it('a reset request still answers 202 (it must not reveal which accounts exist)', async () => {
    const c = await newClient(h.app);
    await c.agent.post('/api/auth/password-reset').set('X-CSRF-Token', c.csrf).send({ email: 'viewer@trimwire.test' }).expect(202);
  });
});
