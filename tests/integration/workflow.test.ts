// The review workflow end to end over the API (real PostgreSQL, pg-boss and an in-process worker):
// upload → assumptions → scan → proposals → decisions (with mail) → apply → exports, with bad input,
// conflicts and another team's resources along the way.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DesignDetailSchema, DesignListResponseSchema } from '@/shared/api/designs';
import { ProposalDetailSchema, ProposalListResponseSchema } from '@/shared/api/proposals';
import { ScanSchema } from '@/shared/api/scans';
import { ReviewQueueResponseSchema } from '@/shared/api/review';
import type { RunningWorker } from '@/server/jobs/worker';
import { mailTo, OTHER_TEAM, roleEmail, signIn, startHarness, type Client, type Harness } from './support/harness';
import { expectError, inProcessWorker, settle, upload, waitForMail } from './support/workflow';

describe('review workflow API', () => {
  let h: Harness;
  let worker: RunningWorker;
  let designer: Client;
  let reviewer: Client;
  let viewer: Client;
  let outsider: Client;
  let designId = '';
  let scanId = '';

  beforeAll(async () => {
    h = await startHarness();
    worker = await inProcessWorker({}, h.env.SMTP_URL);
    [designer, reviewer, viewer, outsider] = await Promise.all([
      signIn(h.app, roleEmail('designer')),
      signIn(h.app, roleEmail('reviewer')),
      signIn(h.app, roleEmail('viewer')),
      signIn(h.app, OTHER_TEAM.admin),
    ]);
  });
  afterAll(async () => {
    await worker?.stop();
    await h?.close();
  });

  it('uploads a deck: design, revision 1 with counts and sha256, the board with its budget', async () => {
    const res = await upload(designer, 'wren8-register-slice.cir', { name: 'Register slice', family: 'detect', boardName: 'Card A', budgetParts: '30', budgetCost: '1.5' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const d = DesignDetailSchema.parse(res.body);
    designId = d.id;
    expect(d.family).toBe('rtl'); // bipolar transistors and resistors only
    expect(d.revisions).toHaveLength(1);
    // 4 bits × (4 transistors, 6 resistors) + 4 load resistors, counted by hand from the deck
    expect(d.revisions[0]!.partCounts).toMatchObject({ transistors: 16, resistors: 28, diodes: 0 });
    expect(d.revisions[0]!.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(d.boards[0]).toMatchObject({ name: 'Card A', budget: { parts: 30, cost: 1.5 } });
    expect(d.boards[0]!.usage.before.parts).toBe(44);
    const list = DesignListResponseSchema.parse((await viewer.agent.get('/api/designs').expect(200)).body);
    expect(list.designs.map((x) => x.id)).toContain(designId);
  });

  it('refuses a broken deck with located diagnostics and stores nothing', async () => {
    const before = await h.db.models.Design.count();
    const revsBefore = await h.db.models.Revision.count();
    const res = await upload(designer, 'broken.cir', { name: 'Broken' }, 'Broken deck\nQ1 C B\n.end\n');
    expectError(res, 400, 'parse-error');
    const diag = res.body.error.details.diagnostics[0];
    expect(diag).toMatchObject({ severity: 'error', line: 2, file: 'broken.cir' });
    expect(diag.col).toBeGreaterThanOrEqual(1);
    expect(await h.db.models.Design.count()).toBe(before);
    expect(await h.db.models.Revision.count()).toBe(revsBefore);
  });

  it('refuses uploads without a file, without a name, or from a viewer', async () => {
    const noFile = await designer.agent.post('/api/designs').set('X-CSRF-Token', designer.csrf).field('name', 'x');
    expectError(noFile, 400, 'bad-request');
    const noName = await designer.agent.post('/api/designs').set('X-CSRF-Token', designer.csrf).attach('file', Buffer.from('t\nR1 a 0 1k\n.end\n'), 'r.cir');
    expectError(noName, 400, 'bad-request');
    expectError(await upload(viewer, 'wren8-decoder.cir'), 403, 'forbidden');
  });

  it('hides the design from another team (404, no leak)', async () => {
    expectError(await outsider.agent.get(`/api/designs/${designId}`), 404, 'not-found');
    const list = await outsider.agent.get('/api/designs').expect(200);
    expect(list.body.designs).toEqual([]);
    expectError(await outsider.agent.get(`/api/designs/${designId}/proposals`), 404, 'not-found');
  });

  it('checks assumptions with the engine parser and the design nets', async () => {
    const bad = await designer.agent.post(`/api/designs/${designId}/assumptions`).set('X-CSRF-Token', designer.csrf).send({ expression: '!(CLR & )', justification: 'x' });
    expectError(bad, 400, 'assumption-parse');
    expect(bad.body.error.details.column).toBe(9);
    const unknown = await designer.agent.post(`/api/designs/${designId}/assumptions`).set('X-CSRF-Token', designer.csrf).send({ expression: '!(CLEAR & LD)', justification: 'x' });
    expectError(unknown, 400, 'assumption-parse');
    expect(unknown.body.error.details.unknownNets).toEqual(['CLEAR']);
    const ok = await designer.agent.post(`/api/designs/${designId}/assumptions`).set('X-CSRF-Token', designer.csrf).send({ expression: '!(CLR & LD)', justification: 'The sequencer never clears while loading (demo).' });
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body).toMatchObject({ expression: '!(CLR & LD)', status: 'active' });
    expect(ok.body.owner).toContain('designer@trimwire.test');
    expectError(await viewer.agent.post(`/api/designs/${designId}/assumptions`).set('X-CSRF-Token', viewer.csrf).send({ expression: 'LD', justification: 'x' }), 403, 'forbidden');
  });

  it('runs a scan in the worker: queued → done with progress, timings and proposals; reviewers are mailed', async () => {
    const res = await designer.agent.post(`/api/designs/${designId}/scans`).set('X-CSRF-Token', designer.csrf).send({});
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    const started = ScanSchema.parse(res.body);
    expect(started.status).toBe('queued');
    scanId = started.id;
    const done = ScanSchema.parse(await settle(designer, scanId));
    expect(done).toMatchObject({ status: 'done', progress: 100, stage: 'done', attempts: 1 });
    expect(done.proposalCount).toBeGreaterThan(0);
    expect(Object.keys(done.timings)).toEqual(expect.arrayContaining(['parse', 'flatten', 'extract', 'store']));
    const mails = await waitForMail(() => mailTo(h.db, roleEmail('reviewer')), (m) => m.subject.includes('to review on Register slice'));
    expect(mails.some((m) => m.subject.includes('to review on Register slice'))).toBe(true);
    // The designer started the scan and gets no review request.
    expect((await mailTo(h.db, roleEmail('designer'))).some((m) => m.subject.includes('to review'))).toBe(false);
    expectError(await designer.agent.post(`/api/scans/${scanId}/cancel`).set('X-CSRF-Token', designer.csrf), 409, 'scan-finished');
  });

  it('refuses scans with unknown rules or revisions', async () => {
    expectError(await designer.agent.post(`/api/designs/${designId}/scans`).set('X-CSRF-Token', designer.csrf).send({ rules: ['no-such-rule'] }), 400, 'bad-request');
    expectError(await designer.agent.post(`/api/designs/${designId}/scans`).set('X-CSRF-Token', designer.csrf).send({ revision: 9 }), 400, 'bad-request');
    expectError(await outsider.agent.get(`/api/scans/${scanId}`), 404, 'not-found');
  });

  it('lists proposals with filters and sorts', async () => {
    const all = ProposalListResponseSchema.parse((await viewer.agent.get(`/api/designs/${designId}/proposals`).expect(200)).body).proposals;
    expect(all.length).toBeGreaterThan(1);
    const savings = all.map((p) => p.savings.parts);
    expect(savings).toEqual([...savings].sort((a, b) => b - a));
    const rule = all[0]!.ruleId;
    const byRule = (await viewer.agent.get(`/api/designs/${designId}/proposals?rule=${rule}`).expect(200)).body.proposals;
    expect(byRule.length).toBeGreaterThan(0);
    expect(byRule.every((p: { ruleId: string }) => p.ruleId === rule)).toBe(true);
    const asc = (await viewer.agent.get(`/api/designs/${designId}/proposals?sort=savings&order=asc`).expect(200)).body.proposals.map((p: { savings: { parts: number } }) => p.savings.parts);
    expect(asc).toEqual([...asc].sort((a: number, b: number) => a - b));
    const board = (await viewer.agent.get(`/api/designs/${designId}`).expect(200)).body.boards[0].id;
    const onBoard = (await viewer.agent.get(`/api/designs/${designId}/proposals?board=${board}`).expect(200)).body.proposals;
    expect(onBoard.length).toBe(all.filter((p) => p.boardIds.includes(board)).length);
    expectError(await viewer.agent.get(`/api/designs/${designId}/proposals?sort=price`), 400, 'bad-request');
    expectError(await viewer.agent.get(`/api/designs/${designId}/proposals?verdict=maybe`), 400, 'bad-request');
  });

  it('shows a proposal with evidence, margins and cautions', async () => {
    const list = (await viewer.agent.get(`/api/designs/${designId}/proposals`).expect(200)).body.proposals;
    const detail = ProposalDetailSchema.parse((await viewer.agent.get(`/api/proposals/${list[0].id}`).expect(200)).body);
    expect(detail.designName).toBe('Register slice');
    expect(detail.startedBy).toContain('designer@trimwire.test');
    expect(detail.cautions.join(' ')).toContain('data sheets');
    expect(detail.edit.removeDevices.length + detail.edit.addDevices.length).toBeGreaterThan(0);
    expectError(await outsider.agent.get(`/api/proposals/${list[0].id}`), 404, 'not-found');
  });

  it('decides: reviewer accepts (designer mailed), overlapping proposals go out of date; rejection needs a reason', async () => {
    const list = ProposalListResponseSchema.parse((await reviewer.agent.get(`/api/designs/${designId}/proposals?status=open`).expect(200)).body).proposals;
    const withOverlap = list.find((p) => p.overlapsWith.length > 0 && p.readiness === 'ready') ?? list.find((p) => p.overlapsWith.length > 0)!;
    expectError(await designer.agent.post(`/api/proposals/${withOverlap.id}/decision`).set('X-CSRF-Token', designer.csrf).send({ decision: 'accept' }), 403, 'forbidden');
    const queue = ReviewQueueResponseSchema.parse((await reviewer.agent.get('/api/review-queue').expect(200)).body);
    expect(queue.proposals.map((p) => p.id)).toContain(withOverlap.id);
    const acc = await reviewer.agent.post(`/api/proposals/${withOverlap.id}/decision`).set('X-CSRF-Token', reviewer.csrf).send({ decision: 'accept' });
    expect(acc.status, JSON.stringify(acc.body)).toBe(200);
    expect(acc.body.status).toBe('accepted');
    expect(acc.body.decisions[0]).toMatchObject({ decision: 'accept', reason: null });
    for (const o of withOverlap.overlapsWith) {
      expect((await viewer.agent.get(`/api/proposals/${o}`).expect(200)).body.status).toBe('out-of-date');
    }
    expectError(await reviewer.agent.post(`/api/proposals/${withOverlap.id}/decision`).set('X-CSRF-Token', reviewer.csrf).send({ decision: 'reject', reason: 'late' }), 409, 'not-open');
    const mails = await waitForMail(() => mailTo(h.db, roleEmail('designer')), (m) => m.subject.startsWith('Proposal accepted'));
    expect(mails.some((m) => m.subject.startsWith('Proposal accepted'))).toBe(true);

    const rest = (await reviewer.agent.get(`/api/designs/${designId}/proposals?status=open`).expect(200)).body.proposals;
    if (rest.length) {
      expectError(await reviewer.agent.post(`/api/proposals/${rest[0].id}/decision`).set('X-CSRF-Token', reviewer.csrf).send({ decision: 'reject' }), 400, 'bad-request');
      const rej = await reviewer.agent.post(`/api/proposals/${rest[0].id}/decision`).set('X-CSRF-Token', reviewer.csrf).send({ decision: 'reject', reason: 'Rise time too close to the clock.' });
      expect(rej.status).toBe(200);
      expect(rej.body.decisions[0]).toMatchObject({ decision: 'reject', reason: 'Rise time too close to the clock.' });
    }
  });

  it('refuses a decision on a proposal from the reviewer\'s own scan (403 own-scan) and hides it from their queue', async () => {
    const admin = await signIn(h.app, roleEmail('admin'));
    const s = await admin.agent.post(`/api/designs/${designId}/scans`).set('X-CSRF-Token', admin.csrf).send({ rules: ['merge-duplicate-logic', 'double-inversion'] }).expect(202);
    const done = await settle(admin, s.body.id);
    expect(done.status).toBe('done');
    const mine = await h.db.models.Proposal.findAll({ where: { scanId: s.body.id } });
    if (!mine.length) {
      // Every proposal of this rule set was already decided on the revision; make the admin's scan own one.
      const any = await h.db.models.Proposal.findOne({ where: { designId, status: 'out-of-date' } });
      await any!.update({ scanId: s.body.id, status: 'open' });
      mine.push(any!);
    }
    expectError(await admin.agent.post(`/api/proposals/${mine[0]!.id}/decision`).set('X-CSRF-Token', admin.csrf).send({ decision: 'accept' }), 403, 'own-scan');
    const queue = (await admin.agent.get('/api/review-queue').expect(200)).body.proposals.map((p: { id: string }) => p.id);
    expect(queue).not.toContain(mine[0]!.id);
  });

  it('keeps comments', async () => {
    const p = (await viewer.agent.get(`/api/designs/${designId}/proposals`).expect(200)).body.proposals[0];
    const c = await reviewer.agent.post(`/api/proposals/${p.id}/comments`).set('X-CSRF-Token', reviewer.csrf).send({ body: 'Checked the fan-out by hand.' });
    expect(c.status).toBe(201);
    expectError(await reviewer.agent.post(`/api/proposals/${p.id}/comments`).set('X-CSRF-Token', reviewer.csrf).send({ body: '' }), 400, 'bad-request');
    expectError(await viewer.agent.post(`/api/proposals/${p.id}/comments`).set('X-CSRF-Token', viewer.csrf).send({ body: 'hi' }), 403, 'forbidden');
    const list = (await viewer.agent.get(`/api/proposals/${p.id}/comments`).expect(200)).body.comments;
    expect(list.map((x: { body: string }) => x.body)).toContain('Checked the fan-out by hand.');
  });

  it('applies accepted proposals into revision 2 (409s first, nothing written), and the SPICE export loads in ngspice', async () => {
    const accepted = (await designer.agent.get(`/api/designs/${designId}/proposals?status=accepted`).expect(200)).body.proposals;
    expect(accepted.length).toBeGreaterThan(0);
    const open = (await designer.agent.get(`/api/designs/${designId}/proposals?status=rejected`).expect(200)).body.proposals;
    const post = (body: object) => designer.agent.post(`/api/designs/${designId}/revisions`).set('X-CSRF-Token', designer.csrf).send(body);
    const revs = await h.db.models.Revision.count({ where: { designId } });
    expectError(await post({ applyProposalIds: [accepted[0].id], baseRevision: 2 }), 409, 'revision-moved');
    if (open.length) expectError(await post({ applyProposalIds: [open[0].id], baseRevision: 1 }), 409, 'not-accepted');
    // Two accepted proposals that change the same parts are refused together.
    const overlapping = await h.db.models.Proposal.findOne({ where: { id: accepted[0].overlapsWith[0] ?? accepted[0].id } });
    if (overlapping && overlapping.id !== accepted[0].id) {
      const was = overlapping.status;
      await overlapping.update({ status: 'accepted' });
      expectError(await post({ applyProposalIds: [accepted[0].id, overlapping.id], baseRevision: 1 }), 409, 'proposals-overlap');
      await overlapping.update({ status: was });
    }
    expect(await h.db.models.Revision.count({ where: { designId } })).toBe(revs);
    expectError(await reviewer.agent.post(`/api/designs/${designId}/revisions`).set('X-CSRF-Token', reviewer.csrf).send({ applyProposalIds: [accepted[0].id], baseRevision: 1 }), 403, 'forbidden');

    const res = await post({ applyProposalIds: [accepted[0].id], baseRevision: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.number).toBe(2);
    expect(res.body.appliedProposals).toEqual([accepted[0].id]);
    expect(res.body.delta.total).toBe(-(accepted[0].savings.transistors + accepted[0].savings.resistors + accepted[0].savings.diodes + accepted[0].savings.capacitors));
    expect((await designer.agent.get(`/api/proposals/${accepted[0].id}`).expect(200)).body.status).toBe('applied');

    const deck = await designer.agent.get(`/api/designs/${designId}/revisions/2/export?format=spice`).buffer(true).parse((r, cb) => {
      let t = '';
      r.on('data', (c: Buffer) => (t += c.toString()));
      r.on('end', () => cb(null, t));
    });
    expect(deck.status).toBe(200);
    expect(deck.headers['content-disposition']).toMatch(/attachment; filename=".*-r2\.cir"/);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'trimwire-export-'));
    const file = path.join(dir, 'r2.cir');
    fs.writeFileSync(file, `${deck.body as string}`.replace(/\.end\s*$/i, '.op\n.end\n'));
    // ngspice: a deck that loads runs the operating point and exits 0; a parse error exits non-zero.
    const out = execFileSync('ngspice', ['-b', file], { encoding: 'utf8', timeout: 30_000, stdio: ['ignore', 'pipe', 'pipe'] });
    expect(out).not.toMatch(/error/i);
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('exports every format with a download name; the HTML report escapes and carries the cautions', async () => {
    for (const [format, type, ext] of [['spice', 'spice', '.cir'], ['verilog', 'verilog', '.v'], ['json', 'json', '.json'], ['bom', 'csv', '-bom.csv'], ['report', 'markdown', '-report.md'], ['report-html', 'html', '-report.html']] as const) {
      const res = await viewer.agent.get(`/api/designs/${designId}/revisions/1/export?format=${format}`).buffer(true).parse((r, cb) => {
        let t = '';
        r.on('data', (c: Buffer) => (t += c.toString()));
        r.on('end', () => cb(null, t));
      });
      expect(res.status, format).toBe(200);
      expect(res.headers['content-type']).toContain(type);
      expect(res.headers['content-disposition']).toContain(ext);
      if (format === 'bom') {
        const lines = (res.body as string).trim().split('\r\n');
        expect(lines[0]).toBe('part kind,value/model,quantity,refs,footprint,unit price (EUR),extended (EUR)');
        const npn = lines.find((l) => l.startsWith('npn,'))!;
        expect(npn.split(',')[2]).toBe('16');
      }
      if (format === 'report-html') {
        expect(res.body).toContain('licensed practice');
        expect(res.body).toContain('Rise time too close to the clock.');
        expect(res.body).not.toMatch(/<script/i);
      }
    }
    expectError(await viewer.agent.get(`/api/designs/${designId}/revisions/1/export?format=pdf`), 400, 'bad-request');
    expectError(await viewer.agent.get(`/api/designs/${designId}/revisions/7/export?format=json`), 404, 'not-found');
    expectError(await outsider.agent.get(`/api/designs/${designId}/revisions/1/export?format=json`), 404, 'not-found');
    const audit = (await (await signIn(h.app, roleEmail('admin'))).agent.get('/api/audit').expect(200)).body.entries.map((e: { action: string }) => e.action);
    expect(audit).toEqual(expect.arrayContaining(['upload', 'scan-started', 'scan-finished', 'decision', 'apply', 'export']));
  });

  it('withdrawing an assumption puts the proposals that relied on it out of date', async () => {
    const a = (await viewer.agent.get(`/api/designs/${designId}/assumptions`).expect(200)).body.assumptions[0];
    const relying = await h.db.models.Proposal.create({
      scanId, designId, revisionId: (await h.db.models.Revision.findOne({ where: { designId, number: 2 } }))!.id, revisionNumber: 2,
      engineId: 'test-relying', ruleId: 'two-level-minimise', title: 't', message: 'm', location: { devices: [], instances: [], nets: [] },
      edit: { removeDevices: [], addDevices: [], reconnect: [], mergeNets: [] }, savings: { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0, parts: 0, areaMm2: 0, cost: 0 },
      savingsParts: 0, verification: { status: 'proved', method: 'exhaustive', assumptions: [a.id], compared: [], simulatedVectors: 0 }, margins: [],
      assumptionIds: [a.id], verdict: 'proved', marginStatus: 'pass', readiness: 'ready',
    });
    await designer.agent.delete(`/api/designs/${designId}/assumptions/${a.id}`).set('X-CSRF-Token', designer.csrf).expect(204);
    await relying.reload();
    expect(relying.status).toBe('out-of-date');
    const after = (await viewer.agent.get(`/api/designs/${designId}/assumptions`).expect(200)).body.assumptions[0];
    expect(after.status).toBe('withdrawn');
  });
});
