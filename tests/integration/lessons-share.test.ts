// Share links against real PostgreSQL: a link opens only its own lesson (nothing else of the team
// is reachable through it), stops working when revoked, expired or unpublished, team-only links
// need a signed-in member, and tokens cannot be guessed (43 base64url characters from 32 random
// bytes, only their hash stored).
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ExplorerData } from '@/optimizer/whatif';
import { hashShareToken, newShareToken } from '@/server/features/share/service';
import { ShareLinkListResponseSchema } from '@/shared/api/lessons';
import { ErrorBodySchema } from '@/shared/api/error';
import { newClient, OTHER_TEAM, roleEmail, signIn, startHarness, type Client, type Harness } from './support/harness';
import { seedLessonDesign, type LessonDesign } from './lessons-fixture';

let h: Harness;
let fx: LessonDesign;
let second: LessonDesign;
let educator: Client;
const post = (c: Client, path: string, body?: object) => c.agent.post(path).set('X-CSRF-Token', c.csrf).send(body);

async function publishedLesson(proposalIds: string[], designId = fx.designId, title = 'Bus lesson'): Promise<string> {
  const res = await post(educator, '/api/lessons', { title, designId, proposalIds, sections: [{ heading: 'Read me', body: 'Toggle the bus rewrite.' }] });
  expect(res.status).toBe(201);
  await post(educator, `/api/lessons/${res.body.id}/publish`).expect(200);
  return res.body.id as string;
}

async function share(lessonId: string, body: object = { public: true }) {
  const res = await post(educator, `/api/lessons/${lessonId}/share-links`, body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { id: string; token: string; url: string; public: boolean };
}

beforeAll(async () => {
  h = await startHarness();
  fx = await seedLessonDesign(h.db, h.demoTeamId);
  second = await seedLessonDesign(h.db, h.demoTeamId, 'Wren-8 second bus');
  educator = await signIn(h.app, roleEmail('educator'));
});
afterAll(async () => {
  await h.close();
});

describe('share links', () => {
  it('gives a 43-character base64url token and a url, and stores only its sha256', async () => {
    const id = await publishedLesson(fx.proposalIds);
    const link = await share(id);
    expect(link.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(link.url).toBe(`${h.env.PUBLIC_URL}/share/${link.token}`);
    const row = await h.db.models.LessonShareLink.findByPk(link.id);
    expect(row!.tokenHash).toBe(hashShareToken(link.token));
    expect(row!.tokenHash).not.toContain(link.token);
    // No column of any stored link holds the token itself.
    const rows = await h.db.sequelize.query<{ row: string }>(`SELECT l::text AS row FROM lesson_share_links l`, { type: QueryTypes.SELECT });
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.filter((r) => r.row.includes(link.token))).toEqual([]);
    const list = ShareLinkListResponseSchema.parse((await educator.agent.get(`/api/lessons/${id}/share-links`)).body);
    expect(list.links.map((l) => l.id)).toContain(link.id);
    expect(JSON.stringify(list)).not.toContain(link.token);
  });

  it('opens a public link signed out, with its lesson and nothing else of the team', async () => {
    const bus = fx.byRule['tristate-slim']!;
    const id = await publishedLesson([bus]);
    const otherLesson = await publishedLesson(second.proposalIds, second.designId, 'Another lesson');
    const link = await share(id);
    const anon = await newClient(h.app);
    const res = await anon.agent.get(`/api/share/${link.token}`);
    expect(res.status).toBe(200);
    expect(res.body.lesson.id).toBe(id);
    expect(res.body.lesson.sections[0].body).toBe('Toggle the bus rewrite.');
    const explorer = res.body.explorer as ExplorerData;
    expect(explorer.proposals.map((p) => p.id)).toEqual([bus]);
    const text = JSON.stringify(res.body);
    // Not the design's id, its other proposals, the other lesson, its design, or anyone's e-mail.
    for (const hidden of [fx.designId, fx.revisionId, fx.byRule['two-level-minimise']!, otherLesson, second.designId, ...second.proposalIds, h.demoTeamId]) {
      expect(text).not.toContain(hidden);
    }
    expect(text).not.toMatch(/@trimwire\.test/);
    // The same client reaches nothing else: the API still wants a session.
    expect((await anon.agent.get(`/api/lessons/${otherLesson}`)).status).toBe(401);
    expect((await anon.agent.get(`/api/lessons/${id}/explorer`)).status).toBe(401);
    expect((await anon.agent.get(`/api/designs/${fx.designId}/explorer`)).status).toBe(401);
    // What-if through the link covers the link's proposals only.
    const ok = await post(anon, `/api/share/${link.token}/whatif`, { settings: { pullUpOhms: 20_000 }, enabled: [bus] });
    expect(ok.status).toBe(200);
    expect(ok.body.worstRiseTime.status).toBe('fail');
    const reach = await post(anon, `/api/share/${link.token}/whatif`, { enabled: [fx.byRule['two-level-minimise']] });
    expect(reach.status).toBe(400);
  });

  it('stops working when revoked, expired, unpublished or deleted — the same 404 each time', async () => {
    const id = await publishedLesson(fx.proposalIds);
    const anon = await newClient(h.app);
    const gone = async (token: string) => {
      const res = await anon.agent.get(`/api/share/${token}`);
      expect(res.status).toBe(404);
      return ErrorBodySchema.parse(res.body).error.message;
    };
    const revoked = await share(id);
    await anon.agent.get(`/api/share/${revoked.token}`).expect(200);
    expect((await educator.agent.delete(`/api/lessons/${id}/share-links/${revoked.id}`).set('X-CSRF-Token', educator.csrf)).status).toBe(204);
    const m1 = await gone(revoked.token);

    const expiring = await share(id, { public: true, expiresAt: new Date(Date.now() + 60_000).toISOString() });
    await anon.agent.get(`/api/share/${expiring.token}`).expect(200);
    await h.db.models.LessonShareLink.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: expiring.id } });
    const m2 = await gone(expiring.token);

    const unknown = await gone(newShareToken().token);
    const malformed = await gone('not-a-token');
    expect(new Set([m1, m2, unknown, malformed]).size).toBe(1);

    const unpublished = await share(id);
    await educator.agent.patch(`/api/lessons/${id}`).set('X-CSRF-Token', educator.csrf).send({ status: 'draft' }).expect(200);
    await gone(unpublished.token);
    await post(educator, `/api/lessons/${id}/publish`).expect(200);
    await anon.agent.get(`/api/share/${unpublished.token}`).expect(200);
    await educator.agent.delete(`/api/lessons/${id}`).set('X-CSRF-Token', educator.csrf).expect(204);
    await gone(unpublished.token);
  });

  it('refuses to share a draft or with an expiry in the past', async () => {
    const draft = await post(educator, '/api/lessons', { title: 'Draft', designId: fx.designId });
    const res = await post(educator, `/api/lessons/${draft.body.id}/share-links`, { public: true });
    expect(res.status).toBe(409);
    const id = await publishedLesson([]);
    expect((await post(educator, `/api/lessons/${id}/share-links`, { public: true, expiresAt: new Date(Date.now() - 5000).toISOString() })).status).toBe(409);
    expect((await post(educator, `/api/lessons/${id}/share-links`, { public: 'yes' })).status).toBe(400);
  });

  it('opens a team-only link for signed-in members (viewers too) and no one else', async () => {
    const id = await publishedLesson(fx.proposalIds);
    const link = await share(id, { public: false });
    expect((await (await newClient(h.app)).agent.get(`/api/share/${link.token}`)).status).toBe(401);
    expect((await (await signIn(h.app, OTHER_TEAM.member)).agent.get(`/api/share/${link.token}`)).status).toBe(404);
    const viewer = await signIn(h.app, roleEmail('viewer'));
    const res = await viewer.agent.get(`/api/share/${link.token}`);
    expect(res.status).toBe(200);
    expect(res.body.lesson.id).toBe(id);
  });
});

describe('share tokens cannot be guessed', () => {
  it('are 1000 times distinct, 43 characters each', () => {
    const tokens = Array.from({ length: 1000 }, () => newShareToken().token);
    expect(new Set(tokens).size).toBe(1000);
    for (const t of tokens) expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
  });

  it('decode to 32 bytes spread evenly over 0–255 (χ² well under its 255-degree bound)', () => {
    const counts = new Array<number>(256).fill(0);
    const n = 1000;
    for (let i = 0; i < n; i++) {
      const bytes = Buffer.from(newShareToken().token, 'base64url');
      expect(bytes.length).toBe(32);
      for (const b of bytes) counts[b]!++;
    }
    const expected = (n * 32) / 256;
    const chi2 = counts.reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    // χ² with 255 degrees of freedom has mean 255 and s.d. ≈ 22.6; 400 is over six s.d. (textbook statistics).
    expect(chi2).toBeLessThan(400);
    expect(Math.min(...counts)).toBeGreaterThan(0);
  });
});
