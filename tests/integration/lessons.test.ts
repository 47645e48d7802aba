// Lessons API against real PostgreSQL: build from a revision and chosen proposals, sections kept in
// the order sent, drafts hidden from all but author and admins, duplicate/publish/delete, bad input
// and other teams' resources; the explorer's data and the server's what-if equal the engine's.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runWhatIf, type ExplorerData } from '@/optimizer/whatif';
import { LessonSchema, LessonListResponseSchema } from '@/shared/api/lessons';
import { ErrorBodySchema } from '@/shared/api/error';
import { OTHER_TEAM, roleEmail, signIn, startHarness, type Client, type Harness } from './support/harness';
import { seedLessonDesign, type LessonDesign } from './lessons-fixture';

let h: Harness;
let fx: LessonDesign;
let other: LessonDesign;
const as: Record<string, Client> = {};

const post = (c: Client, path: string, body?: object) => c.agent.post(path).set('X-CSRF-Token', c.csrf).send(body);
const patch = (c: Client, path: string, body: object) => c.agent.patch(path).set('X-CSRF-Token', c.csrf).send(body);
const del = (c: Client, path: string) => c.agent.delete(path).set('X-CSRF-Token', c.csrf);

async function newLesson(c: Client, extra: object = {}) {
  const res = await post(c, '/api/lessons', {
    title: 'What a shared enable costs',
    designId: fx.designId,
    proposalIds: fx.proposalIds,
    sections: [
      { heading: 'The bus', body: 'Two **tri-state** stages share `BUS`.' },
      { heading: 'The strobe', body: '<script>alert(1)</script> stays text.' },
    ],
    ...extra,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return LessonSchema.parse(res.body);
}

beforeAll(async () => {
  h = await startHarness();
  fx = await seedLessonDesign(h.db, h.demoTeamId);
  other = await seedLessonDesign(h.db, h.otherTeamId, 'Harrow bus');
  for (const role of ['admin', 'educator', 'designer', 'viewer'] as const) as[role] = await signIn(h.app, roleEmail(role));
  as.outsider = await signIn(h.app, OTHER_TEAM.admin);
});
afterAll(async () => {
  await h.close();
});

describe('lessons', () => {
  it('an educator builds a draft from a revision, its proposals and notes in sections', async () => {
    const l = await newLesson(as.educator!);
    expect(l.status).toBe('draft');
    expect(l.revision).toBe(1);
    expect(l.designName).toBe('Wren-8 strobe and bus');
    expect(l.proposalIds.sort()).toEqual([...fx.proposalIds].sort());
    expect(l.sections.map((s) => s.heading)).toEqual(['The bus', 'The strobe']);
    // Markdown is stored as text, byte for byte; rendering it safely is the client's job.
    expect(l.sections[1]!.body).toBe('<script>alert(1)</script> stays text.');
  });

  it('shows a draft to its author and admins only; publishing shows it to the team', async () => {
    const l = await newLesson(as.educator!);
    for (const who of ['designer', 'viewer'] as const) {
      expect((await as[who]!.agent.get(`/api/lessons/${l.id}`)).status).toBe(404);
      const list = LessonListResponseSchema.parse((await as[who]!.agent.get('/api/lessons')).body);
      expect(list.lessons.map((x) => x.id)).not.toContain(l.id);
    }
    expect((await as.admin!.agent.get(`/api/lessons/${l.id}`)).status).toBe(200);
    const pub = await post(as.educator!, `/api/lessons/${l.id}/publish`);
    expect(pub.status).toBe(200);
    expect(pub.body.status).toBe('published');
    expect(pub.body.publishedAt).not.toBeNull();
    expect((await as.viewer!.agent.get(`/api/lessons/${l.id}`)).status).toBe(200);
    const back = await patch(as.educator!, `/api/lessons/${l.id}`, { status: 'draft' });
    expect(back.body.status).toBe('draft');
    expect((await as.viewer!.agent.get(`/api/lessons/${l.id}`)).status).toBe(404);
  });

  it('saves edits and a reorder of sections, keeping each section’s id', async () => {
    const l = await newLesson(as.educator!);
    const [a, b] = l.sections;
    const res = await patch(as.educator!, `/api/lessons/${l.id}`, {
      title: 'Open-drain bus, step by step',
      sections: [b, { ...a!, body: 'Edited.' }, { heading: 'Try it', body: 'Move the pull-up slider.' }],
      proposalIds: [fx.byRule['tristate-slim']],
    });
    expect(res.status).toBe(200);
    const got = LessonSchema.parse((await as.educator!.agent.get(`/api/lessons/${l.id}`)).body);
    expect(got.title).toBe('Open-drain bus, step by step');
    expect(got.sections.map((s) => s.id).slice(0, 2)).toEqual([b!.id, a!.id]);
    expect(got.sections.map((s) => s.body)).toEqual([b!.body, 'Edited.', 'Move the pull-up slider.']);
    expect(got.sections[2]!.id).toMatch(/^[0-9a-f-]{36}$/);
    expect(got.proposalIds).toEqual([fx.byRule['tristate-slim']]);
  });

  it('duplicates as the caller’s new draft and deletes', async () => {
    const l = await newLesson(as.educator!);
    await post(as.educator!, `/api/lessons/${l.id}/publish`).expect(200);
    const copy = await post(as.admin!, `/api/lessons/${l.id}/duplicate`);
    expect(copy.status).toBe(201);
    expect(copy.body.id).not.toBe(l.id);
    expect(copy.body.title).toBe(`${l.title} (copy)`);
    expect(copy.body.status).toBe('draft');
    expect(copy.body.sections.map((s: { body: string }) => s.body)).toEqual(l.sections.map((s) => s.body));
    expect(copy.body.sections.map((s: { id: string }) => s.id)).not.toEqual(l.sections.map((s) => s.id));
    expect((await del(as.educator!, `/api/lessons/${l.id}`)).status).toBe(204);
    expect((await as.educator!.agent.get(`/api/lessons/${l.id}`)).status).toBe(404);
    expect((await as.admin!.agent.get(`/api/lessons/${copy.body.id}`)).status).toBe(200);
  });

  it('lets only the author or an admin change a lesson', async () => {
    const l = await newLesson(as.admin!);
    await post(as.admin!, `/api/lessons/${l.id}/publish`).expect(200);
    const res = await patch(as.educator!, `/api/lessons/${l.id}`, { title: 'Not mine' });
    expect(res.status).toBe(403);
    expect(ErrorBodySchema.parse(res.body).error.code).toBe('forbidden');
  });

  it('refuses proposals of another design and bad input, with the error body', async () => {
    const foreign = await post(as.educator!, '/api/lessons', { title: 'x', designId: fx.designId, proposalIds: [other.proposalIds[0]] });
    expect(foreign.status).toBe(400);
    expect(ErrorBodySchema.parse(foreign.body).error.message).toMatch(/design revision/);
    const blank = await post(as.educator!, '/api/lessons', { title: '  ', designId: fx.designId });
    expect(blank.status).toBe(400);
    const extra = await post(as.educator!, '/api/lessons', { title: 'x', designId: fx.designId, html: '<b>' });
    expect(extra.status).toBe(400);
    const noRev = await post(as.educator!, '/api/lessons', { title: 'x', designId: fx.designId, revision: 7 });
    expect(noRev.status).toBe(404);
  });

  it('hides another team’s designs and lessons (404, no leak)', async () => {
    const res = await post(as.outsider!, '/api/lessons', { title: 'x', designId: fx.designId });
    expect(res.status).toBe(404);
    const l = await newLesson(as.educator!);
    await post(as.educator!, `/api/lessons/${l.id}/publish`).expect(200);
    expect((await as.outsider!.agent.get(`/api/lessons/${l.id}`)).status).toBe(404);
    expect((await as.outsider!.agent.get(`/api/lessons/${l.id}/explorer`)).status).toBe(404);
    expect((await as.outsider!.agent.get(`/api/designs/${fx.designId}/explorer`)).status).toBe(404);
    const list = LessonListResponseSchema.parse((await as.outsider!.agent.get('/api/lessons')).body);
    expect(list.lessons.map((x) => x.id)).not.toContain(l.id);
  });
});

describe('explorer and what-if', () => {
  let lessonId: string;
  let data: ExplorerData;
  beforeAll(async () => {
    const l = await newLesson(as.educator!);
    await post(as.educator!, `/api/lessons/${l.id}/publish`).expect(200);
    lessonId = l.id;
    data = (await as.viewer!.agent.get(`/api/lessons/${l.id}/explorer`).expect(200)).body as ExplorerData;
  });

  it('carries the lesson’s proposals with their savings, margins and the inputs behind them', () => {
    expect(data.proposals.map((p) => p.id).sort()).toEqual([...fx.proposalIds].sort());
    expect(data.design.revision).toBe(1);
    const bus = data.inputs.proposals.find((p) => p.ruleId === 'tristate-slim')!;
    expect(bus.margins.map((m) => m.name)).toContain('rise time');
    expect(bus.margins.every((m) => m.inputs !== undefined)).toBe(true);
    // 4 in the strobe NAND, 6 in each bus slice, 2 in the reader.
    expect(data.inputs.baseline.transistors).toBe(18);
    expect(data.defaults.settings.supplyVolts).toBe(5);
    expect(data.pricesNote).toMatch(/invented/);
  });

  it('carries each rewrite’s changed region for the before/after drawing', () => {
    const strobe = data.proposals.find((p) => p.ruleId === 'two-level-minimise')!;
    // The NAND's four transistors go; what replaces them reads WR and drives WS.
    expect(strobe.region.before.map((d) => d.name).sort()).toEqual(['MNW1', 'MNW2', 'MPW1', 'MPW2']);
    expect(strobe.region.before.find((d) => d.name === 'MPW1')!.terminals).toContain('WS');
    expect(strobe.region.after.length).toBeGreaterThan(0);
    expect(strobe.region.after.flatMap((d) => d.terminals)).toEqual(expect.arrayContaining(['WS', 'WR']));
  });

  it('gives the two-level side by side: truth table, the assumption’s don’t-care and the scan’s cover', () => {
    const tl = data.proposals.find((p) => p.ruleId === 'two-level-minimise')!.twoLevel!;
    expect(tl.output).toBe('WS');
    // WS = NAND(WR, SEL); "WR -> SEL" excludes WR=1, SEL=0, and the cover is WR'.
    const row = (wr: 0 | 1, sel: 0 | 1) => tl.rows.find((r) => r.bits[tl.inputs.indexOf('WR')] === wr && r.bits[tl.inputs.indexOf('SEL')] === sel)!;
    expect(tl.dontCares).toBe(1);
    expect(row(1, 0).excludedBy).toHaveLength(1);
    expect(row(1, 1).before).toBe(0);
    expect(row(0, 0).before).toBe(1);
    expect(tl.cover).toMatchObject({ text: "WR'", source: 'scan' });
    expect(tl.rows.map((r) => r.after)).toEqual(tl.rows.map((r) => r.cover));
    expect(tl.map).not.toBeNull();
  });

  it('computes on the server exactly what the engine computes on the same inputs', async () => {
    const bus = data.inputs.proposals.find((p) => p.ruleId === 'tristate-slim')!.id;
    const cases = [{}, { pullUpOhms: 15_000 }, { clockPeriod: 5e-7, loads: 6 }, { supplyVolts: 3.3, betaMin: 20 }];
    for (const [i, settings] of cases.entries()) {
      const enabled = i % 2 ? [bus] : [bus, fx.byRule['two-level-minimise']!];
      const res = await post(as.viewer!, `/api/lessons/${lessonId}/whatif`, { settings, enabled });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toEqual(JSON.parse(JSON.stringify(runWhatIf(data.inputs, settings, enabled))));
    }
  });

  it('turns the bus’s rise time from warn to fail as the pull-up grows, without touching the stored design', async () => {
    const bus = fx.byRule['tristate-slim']!;
    const before = await h.db.models.Proposal.findByPk(bus);
    const at = async (pullUpOhms: number) =>
      (await post(as.viewer!, `/api/lessons/${lessonId}/whatif`, { settings: { pullUpOhms }, enabled: [bus] })).body.worstRiseTime;
    expect((await at(4300)).status).not.toBe('fail');
    expect((await at(20_000)).status).toBe('fail');
    const after = await h.db.models.Proposal.findByPk(bus);
    expect(after!.margins).toEqual(before!.margins);
    expect(after!.updatedAt.getTime()).toBe(before!.updatedAt.getTime());
  });

  it('refuses unknown proposals and impossible settings with 400', async () => {
    const unknown = await post(as.viewer!, `/api/lessons/${lessonId}/whatif`, { enabled: [other.proposalIds[0]] });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/no proposal/);
    const bad = await post(as.viewer!, `/api/lessons/${lessonId}/whatif`, { settings: { supplyVolts: -5 }, enabled: [] });
    expect(bad.status).toBe(400);
  });

  it('answers the recorded cases the browser-side test replays exactly as recorded', async () => {
    // components/data/use-lessons.test.ts runs the engine under happy-dom on the same inputs and
    // checks it against these server results; this test keeps the recording true to the server.
    const file = path.resolve(__dirname, '../fixtures/whatif/wren8-lesson.json');
    const names = new Map(data.inputs.proposals.map((p) => [p.id, `proposal:${p.ruleId}`]));
    const ids = new Map([...names].map(([id, name]) => [name, id]));
    const norm = (x: unknown) => JSON.parse(JSON.stringify(x, (_k, v: unknown) => (typeof v === 'string' && names.has(v) ? names.get(v) : v))) as unknown;
    const bus = 'proposal:tristate-slim';
    const strobe = 'proposal:two-level-minimise';
    const cases = [
      { settings: {}, enabled: [] },
      { settings: {}, enabled: [bus, strobe] },
      { settings: { pullUpOhms: 12_000 }, enabled: [bus] },
      { settings: { clockPeriod: 4e-7, loads: 5, supplyVolts: 4.5 }, enabled: [bus, strobe] },
      { settings: { betaMin: 15, pullUpOhms: 1_000 }, enabled: [strobe] },
    ];
    const recorded = { inputs: norm(data.inputs), cases: [] as unknown[] };
    for (const c of cases) {
      const res = await post(as.viewer!, `/api/lessons/${lessonId}/whatif`, { settings: c.settings, enabled: c.enabled.map((n) => ids.get(n)) });
      expect(res.status).toBe(200);
      recorded.cases.push({ ...c, server: norm(res.body) });
    }
    if (process.env.UPDATE_WHATIF_FIXTURE === '1') fs.writeFileSync(file, `${JSON.stringify(recorded, null, 2)}\n`);
    expect(recorded, 'server results changed: rerun with UPDATE_WHATIF_FIXTURE=1 and review the diff').toEqual(JSON.parse(fs.readFileSync(file, 'utf8')));
  });

  it('opens a design’s explorer for its team with the revision’s proposals', async () => {
    const res = await as.viewer!.agent.get(`/api/designs/${fx.designId}/explorer`);
    expect(res.status).toBe(200);
    expect((res.body as ExplorerData).proposals.map((p) => p.id).sort()).toEqual([...fx.proposalIds].sort());
  });
});
