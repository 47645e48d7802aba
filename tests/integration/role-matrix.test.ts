// Calls every API route as every role and signed out, and checks the status. The table is the
// authorisation policy: a new route adds a row here.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@/shared/api/error';
import { ROLES, type Role } from '@/shared/domain/roles';
import { DEMO_PASSWORD } from '@/server/db/seed';
import { newToken, INVITE_TTL_MS } from '@/server/auth/tokens';
import { listRoutes } from '@/server/http/list-routes';
import { addMember, newClient, roleEmail, signIn, startHarness, type Client, type Harness } from './support/harness';
import { LESSON_ROWS } from './lessons-matrix-rows';

type Caller = Role | 'signed-out';
const CALLERS: readonly Caller[] = [...ROLES, 'signed-out'];

type Call = { method: 'get' | 'post' | 'patch' | 'delete'; path: string; body?: unknown };
type Row = {
  route: string;
  /** Builds the request; fresh targets per call so one caller's success does not change the next one's. */
  call: (h: Harness) => Promise<Call> | Call;
  expect: Record<Caller, number>;
};

const everyone = (status: number): Record<Caller, number> =>
  Object.fromEntries(CALLERS.map((c) => [c, status])) as Record<Caller, number>;
const members = (status: number): Record<Caller, number> => ({ ...everyone(status), 'signed-out': 401 });
const adminsOnly = (status: number): Record<Caller, number> => ({ ...everyone(403), admin: status, 'signed-out': 401 });

let seq = 0;
const freshEmail = () => `matrix-${++seq}@example.test`;

async function freshInvite(h: Harness): Promise<string> {
  const row = await h.db.models.Token.create({
    kind: 'invite', tokenHash: newToken().hash, email: freshEmail(), userId: null, teamId: h.demoTeamId,
    role: 'viewer', createdBy: null, expiresAt: new Date(Date.now() + INVITE_TTL_MS), usedAt: null,
  });
  return row.id;
}

async function freshResetToken(h: Harness): Promise<string> {
  const userId = await addMember(h.db, h.demoTeamId, freshEmail(), 'viewer');
  const { token, hash } = newToken();
  await h.db.models.Token.create({
    kind: 'reset', tokenHash: hash, email: 'x@example.test', userId, teamId: null, role: null,
    createdBy: null, expiresAt: new Date(Date.now() + 60_000), usedAt: null,
  });
  return token;
}

const MATRIX: Row[] = [
  { route: 'GET /api/health', call: () => ({ method: 'get', path: '/api/health' }), expect: everyone(200) },
  { route: 'GET /api/auth/csrf', call: () => ({ method: 'get', path: '/api/auth/csrf' }), expect: everyone(200) },
  {
    route: 'POST /api/auth/sign-in',
    call: () => ({ method: 'post', path: '/api/auth/sign-in', body: { email: 'viewer@trimwire.test', password: DEMO_PASSWORD } }),
    expect: everyone(200),
  },
  { route: 'POST /api/auth/sign-out', call: () => ({ method: 'post', path: '/api/auth/sign-out' }), expect: everyone(204) },
  { route: 'GET /api/auth/me', call: () => ({ method: 'get', path: '/api/auth/me' }), expect: members(200) },
  {
    route: 'POST /api/auth/switch-team (own team)',
    call: (h) => ({ method: 'post', path: '/api/auth/switch-team', body: { teamId: h.demoTeamId } }),
    expect: members(200),
  },
  {
    route: 'POST /api/auth/switch-team (other team)',
    call: (h) => ({ method: 'post', path: '/api/auth/switch-team', body: { teamId: h.otherTeamId } }),
    expect: members(403),
  },
  {
    route: 'POST /api/auth/password-reset',
    call: () => ({ method: 'post', path: '/api/auth/password-reset', body: { email: 'nobody@example.test' } }),
    expect: everyone(202),
  },
  {
    route: 'POST /api/auth/set-password',
    call: async (h) => ({ method: 'post', path: '/api/auth/set-password', body: { token: await freshResetToken(h), password: 'a-new-long-password' } }),
    expect: everyone(200),
  },
  { route: 'GET /api/team', call: () => ({ method: 'get', path: '/api/team' }), expect: members(200) },
  {
    route: 'POST /api/team/invites',
    call: () => ({ method: 'post', path: '/api/team/invites', body: { email: freshEmail(), role: 'designer' } }),
    expect: adminsOnly(201),
  },
  {
    route: 'DELETE /api/team/invites/:id',
    call: async (h) => ({ method: 'delete', path: `/api/team/invites/${await freshInvite(h)}` }),
    expect: adminsOnly(204),
  },
  {
    route: 'PATCH /api/team/members/:userId',
    call: async (h) => ({ method: 'patch', path: `/api/team/members/${await addMember(h.db, h.demoTeamId, undefined, 'designer')}`, body: { role: 'reviewer' } }),
    expect: adminsOnly(200),
  },
  {
    route: 'DELETE /api/team/members/:userId',
    call: async (h) => ({ method: 'delete', path: `/api/team/members/${await addMember(h.db, h.demoTeamId, undefined, 'viewer')}` }),
    expect: adminsOnly(204),
  },
  { route: 'GET /api/team/outbox', call: () => ({ method: 'get', path: '/api/team/outbox' }), expect: adminsOnly(200) },
  { route: 'GET /api/account', call: () => ({ method: 'get', path: '/api/account' }), expect: members(200) },
  {
    route: 'PATCH /api/account',
    call: () => ({ method: 'patch', path: '/api/account', body: { notifications: { decisions: false } } }),
    expect: members(200),
  },
  { route: 'GET /api/audit', call: () => ({ method: 'get', path: '/api/audit' }), expect: adminsOnly(200) },
  ...LESSON_ROWS,
  { route: 'GET /api/no-such-route', call: () => ({ method: 'get', path: '/api/no-such-route' }), expect: everyone(404) },
];

describe('role matrix: every route as every role and signed out', () => {
  let h: Harness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(async () => {
    await h.close();
  });

  async function clientFor(caller: Caller): Promise<Client> {
    return caller === 'signed-out' ? newClient(h.app) : signIn(h.app, roleEmail(caller));
  }

  it('has a row for every API route the app answers', () => {
    const routes = listRoutes(h.app).filter((r) => r.includes(' /api/'));
    expect(routes.length).toBeGreaterThanOrEqual(17);
    const covered = new Set(MATRIX.map((row) => row.route.replace(/ \(.*\)$/, '')));
    expect(routes.filter((r) => !covered.has(r)), 'routes with no row in the role matrix').toEqual([]);
  });

  for (const row of MATRIX) {
    it.each(CALLERS.map((c) => [c, row.expect[c]] as const))(`${row.route} as %s → %i`, async (caller, status) => {
      const client = await clientFor(caller);
      const call = await row.call(h);
      let req = client.agent[call.method](call.path).set('X-CSRF-Token', client.csrf);
      if (call.body !== undefined) req = req.send(call.body as object);
      const res = await req;
      expect(res.status, `${row.route} as ${caller}: ${JSON.stringify(res.body)}`).toBe(status);
      if (status >= 400) expect(ErrorBodySchema.safeParse(res.body).success).toBe(true);
    });
  }
});
