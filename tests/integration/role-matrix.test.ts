// Calls every API route as every role and signed out, and checks the status. The table is the
// authorisation policy: a new route adds a row here.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ErrorBodySchema } from '@/shared/api/error';
import { ROLES, type Role } from '@/shared/domain/roles';
import { DEMO_PASSWORD } from '@/server/db/seed';
import { newToken, INVITE_TTL_MS } from '@/server/auth/tokens';
import { listRoutes } from '@/server/http/list-routes';
import { addMember, newClient, roleEmail, signIn, startHarness, type Client, type Harness } from './support/harness';
import { createDesign } from '@/server/features/designs/service';
import { demoDeck } from './support/workflow';
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

// Review-workflow targets: one demo design per team (made once), fresh scans and proposals per call.
type Fixtures = { designId: string; otherDesignId: string; revisionId: string };
let fixtures: Promise<Fixtures> | undefined;
function workflowFixtures(h: Harness): Promise<Fixtures> {
  return (fixtures ??= (async () => {
    const designer = (await h.db.models.User.findOne({ where: { email: roleEmail('designer') } }))!;
    const outsider = (await h.db.models.User.findOne({ where: { email: 'ops@harrow.test' } }))!;
    const file = { buffer: demoDeck('wren8-decoder.cir'), name: 'wren8-decoder.cir' };
    const d = await createDesign(h.db, designer, h.demoTeamId, file, { name: 'Matrix decoder' });
    const o = await createDesign(h.db, outsider, h.otherTeamId, file, { name: 'Other team decoder' });
    const rev = (await h.db.models.Revision.findOne({ where: { designId: d.id } }))!;
    return { designId: d.id, otherDesignId: o.id, revisionId: rev.id };
  })());
}
async function freshScan(h: Harness): Promise<string> {
  const f = await workflowFixtures(h);
  const s = await h.db.models.Scan.create({ designId: f.designId, revisionId: f.revisionId, revisionNumber: 1, rules: null, startedBy: null, engineVersion: 'matrix' });
  return s.id;
}
async function freshProposal(h: Harness): Promise<string> {
  const f = await workflowFixtures(h);
  const scanId = await freshScan(h);
  const zero = { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0, parts: 0, areaMm2: 0, cost: 0 };
  const p = await h.db.models.Proposal.create({
    scanId, designId: f.designId, revisionId: f.revisionId, revisionNumber: 1, engineId: `matrix-${++seq}`, ruleId: 'double-inversion',
    title: 'matrix proposal', message: 'm', location: { devices: [], instances: [], nets: [] },
    edit: { removeDevices: [], addDevices: [], reconnect: [], mergeNets: [] }, savings: zero, savingsParts: 0,
    verification: { status: 'proved', method: 'exhaustive', assumptions: [], compared: [], simulatedVectors: 0 }, margins: [],
    assumptionIds: [], verdict: 'proved', marginStatus: 'pass', readiness: 'ready',
  });
  return p.id;
}
async function freshAssumption(h: Harness): Promise<string> {
  const f = await workflowFixtures(h);
  const a = await h.db.models.Assumption.create({ designId: f.designId, expression: '!(S0 & S1)', justification: 'matrix', ownerId: null });
  return a.id;
}
async function freshBoard(h: Harness): Promise<string> {
  const f = await workflowFixtures(h);
  return (await h.db.models.Board.create({ designId: f.designId, name: 'matrix board', instances: [], budget: {} })).id;
}
const designers = (status: number): Record<Caller, number> => ({ ...everyone(403), admin: status, designer: status, 'signed-out': 401 });
const reviewersOnly = (status: number): Record<Caller, number> => ({ ...everyone(403), admin: status, reviewer: status, 'signed-out': 401 });
const d = async (h: Harness, rest = '') => `/api/designs/${(await workflowFixtures(h)).designId}${rest}`;

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
  { route: 'GET /api/designs', call: () => ({ method: 'get', path: '/api/designs' }), expect: members(200) },
  { route: 'POST /api/designs (JSON, no file)', call: () => ({ method: 'post', path: '/api/designs', body: { name: 'x' } }), expect: designers(400) },
  { route: 'GET /api/designs/:id', call: async (h) => ({ method: 'get', path: await d(h) }), expect: members(200) },
  {
    route: "GET /api/designs/:id (another team's)",
    call: async (h) => ({ method: 'get', path: `/api/designs/${(await workflowFixtures(h)).otherDesignId}` }),
    expect: members(404),
  },
  {
    route: 'POST /api/designs/:id/revisions (apply on a moved revision)',
    call: async (h) => ({ method: 'post', path: await d(h, '/revisions'), body: { applyProposalIds: [await freshProposal(h)], baseRevision: 5 } }),
    expect: designers(409),
  },
  { route: 'GET /api/designs/:id/revisions/:rev/export', call: async (h) => ({ method: 'get', path: await d(h, '/revisions/1/export?format=json') }), expect: members(200) },
  { route: 'GET /api/designs/:id/assumptions', call: async (h) => ({ method: 'get', path: await d(h, '/assumptions') }), expect: members(200) },
  {
    route: 'POST /api/designs/:id/assumptions',
    call: async (h) => ({ method: 'post', path: await d(h, '/assumptions'), body: { expression: '!(S0 & S1)', justification: 'matrix' } }),
    expect: designers(201),
  },
  {
    route: 'PATCH /api/designs/:id/assumptions/:aid',
    call: async (h) => ({ method: 'patch', path: await d(h, `/assumptions/${await freshAssumption(h)}`), body: { justification: 'changed' } }),
    expect: designers(200),
  },
  {
    route: 'DELETE /api/designs/:id/assumptions/:aid',
    call: async (h) => ({ method: 'delete', path: await d(h, `/assumptions/${await freshAssumption(h)}`) }),
    expect: designers(204),
  },
  { route: 'GET /api/designs/:id/boards', call: async (h) => ({ method: 'get', path: await d(h, '/boards') }), expect: members(200) },
  {
    route: 'POST /api/designs/:id/boards',
    call: async (h) => ({ method: 'post', path: await d(h, '/boards'), body: { name: 'Card', instances: ['XN0'], budget: { parts: 10 } } }),
    expect: designers(201),
  },
  {
    route: 'PATCH /api/designs/:id/boards/:bid',
    call: async (h) => ({ method: 'patch', path: await d(h, `/boards/${await freshBoard(h)}`), body: { budget: { cost: 2 } } }),
    expect: designers(200),
  },
  { route: 'POST /api/designs/:id/scans', call: async (h) => ({ method: 'post', path: await d(h, '/scans'), body: {} }), expect: designers(202) },
  { route: 'GET /api/scans/:id', call: async (h) => ({ method: 'get', path: `/api/scans/${await freshScan(h)}` }), expect: members(200) },
  { route: 'POST /api/scans/:id/cancel', call: async (h) => ({ method: 'post', path: `/api/scans/${await freshScan(h)}/cancel` }), expect: designers(200) },
  { route: 'GET /api/designs/:id/proposals', call: async (h) => ({ method: 'get', path: await d(h, '/proposals?sort=rule') }), expect: members(200) },
  { route: 'GET /api/proposals/:id', call: async (h) => ({ method: 'get', path: `/api/proposals/${await freshProposal(h)}` }), expect: members(200) },
  {
    route: 'POST /api/proposals/:id/decision',
    call: async (h) => ({ method: 'post', path: `/api/proposals/${await freshProposal(h)}/decision`, body: { decision: 'reject', reason: 'matrix' } }),
    expect: reviewersOnly(200),
  },
  { route: 'GET /api/proposals/:id/comments', call: async (h) => ({ method: 'get', path: `/api/proposals/${await freshProposal(h)}/comments` }), expect: members(200) },
  {
    route: 'POST /api/proposals/:id/comments',
    call: async (h) => ({ method: 'post', path: `/api/proposals/${await freshProposal(h)}/comments`, body: { body: 'a note' } }),
    expect: { ...members(201), viewer: 403 },
  },
  { route: 'GET /api/review-queue', call: () => ({ method: 'get', path: '/api/review-queue' }), expect: members(200) },
  { route: 'GET /api/proposals/:id/region', call: async (h) => ({ method: 'get', path: `/api/proposals/${await freshProposal(h)}/region` }), expect: members(200) },
  { route: 'POST /api/proposals/:id/simulate', call: async (h) => ({ method: 'post', path: `/api/proposals/${await freshProposal(h)}/simulate`, body: {} }), expect: members(200) },
  { route: 'GET /api/designs/:id/drawing', call: async (h) => ({ method: 'get', path: await d(h, '/drawing') }), expect: members(200) },
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
