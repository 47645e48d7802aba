// Team rules: a team always keeps an admin, another team's people and records stay invisible,
// removals and role changes take effect at once and are audited, people in two teams can switch.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditResponseSchema } from '@/shared/api/audit';
import { TeamResponseSchema } from '@/shared/api/team';
import { addMember, OTHER_TEAM, signIn, startHarness, type Harness } from './support/harness';

describe('team rules', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(async () => {
    await h.close();
  });

  async function userId(email: string): Promise<string> {
    return (await h.db.models.User.findOne({ where: { email } }))!.id;
  }

  it('the last admin can neither be demoted nor removed; with a second admin both work', async () => {
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const me = await userId('admin@trimwire.test');
    const demote = await admin.agent.patch(`/api/team/members/${me}`).set('X-CSRF-Token', admin.csrf).send({ role: 'designer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last-admin');
    const remove = await admin.agent.delete(`/api/team/members/${me}`).set('X-CSRF-Token', admin.csrf);
    expect(remove.status).toBe(409);
    expect(remove.body.error.code).toBe('last-admin');

    const designer = await userId('designer@trimwire.test');
    const promoted = await admin.agent.patch(`/api/team/members/${designer}`).set('X-CSRF-Token', admin.csrf).send({ role: 'admin' }).expect(200);
    expect(promoted.body).toMatchObject({ userId: designer, email: 'designer@trimwire.test', role: 'admin' });
    const selfDemote = await admin.agent.patch(`/api/team/members/${me}`).set('X-CSRF-Token', admin.csrf).send({ role: 'reviewer' }).expect(200);
    expect(selfDemote.body.role).toBe('reviewer');
    // The change applies to the very next request of the same session.
    const denied = await admin.agent.get('/api/audit');
    expect(denied.status).toBe(403);

    const designerClient = await signIn(h.app, 'designer@trimwire.test');
    await designerClient.agent.patch(`/api/team/members/${me}`).set('X-CSRF-Token', designerClient.csrf).send({ role: 'admin' }).expect(200);
    await designerClient.agent.patch(`/api/team/members/${designer}`).set('X-CSRF-Token', designerClient.csrf).send({ role: 'designer' }).expect(200);

    const audit = AuditResponseSchema.parse((await admin.agent.get('/api/audit').expect(200)).body);
    const changes = audit.entries.filter((e) => e.action === 'role-changed');
    expect(changes.map((e) => [e.actor, e.target, e.details])).toEqual(
      expect.arrayContaining([
        ['admin@trimwire.test', 'designer@trimwire.test', { from: 'designer', to: 'admin' }],
        ['designer@trimwire.test', 'designer@trimwire.test', { from: 'admin', to: 'designer' }],
      ]),
    );
  });

  it('a removed member loses access on the next request, and the removal is audited', async () => {
    const victimId = await addMember(h.db, h.demoTeamId, 'leaving@example.test', 'designer');
    const victim = await signIn(h.app, 'leaving@example.test');
    await victim.agent.get('/api/team').expect(200);
    const admin = await signIn(h.app, 'admin@trimwire.test');
    await admin.agent.delete(`/api/team/members/${victimId}`).set('X-CSRF-Token', admin.csrf).expect(204);
    expect((await victim.agent.get('/api/team')).status).toBe(403);
    const audit = AuditResponseSchema.parse((await admin.agent.get('/api/audit').expect(200)).body);
    expect(audit.entries.some((e) => e.action === 'member-removed' && e.target === 'leaving@example.test')).toBe(true);
  });

  it("another team's members, invites, mail and audit are invisible and untouchable", async () => {
    const ours = await signIn(h.app, 'admin@trimwire.test');
    await ours.agent.post('/api/team/invites').set('X-CSRF-Token', ours.csrf).send({ email: 'secret-hire@example.test', role: 'viewer' }).expect(201);
    const ourInvite = await h.db.models.Token.findOne({ where: { email: 'secret-hire@example.test' } });

    const theirs = await signIn(h.app, OTHER_TEAM.admin);
    const team = TeamResponseSchema.parse((await theirs.agent.get('/api/team').expect(200)).body);
    expect(team.team.name).toBe(OTHER_TEAM.name);
    expect(team.members.map((m) => m.email).sort()).toEqual([OTHER_TEAM.member, OTHER_TEAM.admin].sort());
    expect(team.invites).toEqual([]);

    const outbox = (await theirs.agent.get('/api/team/outbox').expect(200)).body.messages as { to: string }[];
    expect(outbox.some((m) => m.to.includes('secret-hire@example.test'))).toBe(false);
    const audit = AuditResponseSchema.parse((await theirs.agent.get('/api/audit').expect(200)).body);
    expect(audit.entries.some((e) => e.target === 'secret-hire@example.test' || e.actor === 'admin@trimwire.test')).toBe(false);

    const designer = await userId('designer@trimwire.test');
    const patch = await theirs.agent.patch(`/api/team/members/${designer}`).set('X-CSRF-Token', theirs.csrf).send({ role: 'viewer' });
    expect(patch.status).toBe(404);
    const remove = await theirs.agent.delete(`/api/team/members/${designer}`).set('X-CSRF-Token', theirs.csrf);
    expect(remove.status).toBe(404);
    const revoke = await theirs.agent.delete(`/api/team/invites/${ourInvite!.id}`).set('X-CSRF-Token', theirs.csrf);
    expect(revoke.status).toBe(404);
    const sw = await theirs.agent.post('/api/auth/switch-team').set('X-CSRF-Token', theirs.csrf).send({ teamId: h.demoTeamId });
    expect(sw.status).toBe(403);

    // Nothing changed on our side.
    const ourTeam = TeamResponseSchema.parse((await ours.agent.get('/api/team').expect(200)).body);
    expect(ourTeam.members.find((m) => m.email === 'designer@trimwire.test')?.role).toBe('designer');
    expect(ourTeam.invites.map((i) => i.email)).toContain('secret-hire@example.test');
  });

  it('non-admins see the members but not the pending invites', async () => {
    const viewer = await signIn(h.app, 'viewer@trimwire.test');
    const team = TeamResponseSchema.parse((await viewer.agent.get('/api/team').expect(200)).body);
    expect(team.members.length).toBeGreaterThanOrEqual(5);
    expect(team.invites).toEqual([]);
  });

  it('someone in two teams switches between them and gets that team’s role', async () => {
    await addMember(h.db, h.otherTeamId, 'reviewer@trimwire.test', 'admin');
    const c = await signIn(h.app, 'reviewer@trimwire.test');
    const me = (await c.agent.get('/api/auth/me').expect(200)).body;
    expect(me.teams.map((t: { name: string }) => t.name).sort()).toEqual([OTHER_TEAM.name, 'Larkspur Relay Works'].sort());
    expect(me.role).toBe('reviewer');
    expect((await c.agent.get('/api/audit')).status).toBe(403);
    const sw = await c.agent.post('/api/auth/switch-team').set('X-CSRF-Token', c.csrf).send({ teamId: h.otherTeamId }).expect(200);
    expect(sw.body).toMatchObject({ team: { id: h.otherTeamId }, role: 'admin' });
    await c.agent.get('/api/audit').expect(200);
    const team = (await c.agent.get('/api/team').expect(200)).body;
    expect(team.team.id).toBe(h.otherTeamId);
  });

  it('sign-ins and sign-outs are audited', async () => {
    const c = await signIn(h.app, 'educator@trimwire.test');
    await c.agent.post('/api/auth/sign-out').set('X-CSRF-Token', c.csrf).expect(204);
    expect((await c.agent.get('/api/auth/me')).status).toBe(401);
    const admin = await signIn(h.app, 'admin@trimwire.test');
    const audit = AuditResponseSchema.parse((await admin.agent.get('/api/audit').expect(200)).body);
    expect(audit.entries.some((e) => e.action === 'sign-in' && e.actor === 'educator@trimwire.test')).toBe(true);
    expect(audit.entries.some((e) => e.action === 'sign-out' && e.actor === 'educator@trimwire.test')).toBe(true);
  });

  it('account: name and notification choices are saved per person', async () => {
    const c = await signIn(h.app, 'viewer@trimwire.test');
    const before = (await c.agent.get('/api/account').expect(200)).body;
    expect(before.notifications).toEqual({ reviewRequests: true, decisions: true });
    const after = await c.agent.patch('/api/account').set('X-CSRF-Token', c.csrf).send({ name: 'Priya H.', notifications: { reviewRequests: false } }).expect(200);
    expect(after.body).toMatchObject({ user: { name: 'Priya H.' }, notifications: { reviewRequests: false, decisions: true } });
    const other = await signIn(h.app, 'designer@trimwire.test');
    expect((await other.agent.get('/api/account').expect(200)).body.notifications.reviewRequests).toBe(true);
  });
});
