// A worker killed mid-scan must never leave the scan "running": with the stage-delay test knob
// (TRIMWIRE_SCAN_STAGE_DELAY_MS) a child worker is SIGKILLed while the scan runs; the heartbeat goes
// stale, the scan is swept back to the queue and another worker finishes it (attempt 2). A scan
// whose worker keeps dying fails once its attempts are used. A running scan can be cancelled.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningWorker } from '@/server/jobs/worker';
import { sweepStaleScans } from '@/server/jobs/sweeper';
import { roleEmail, signIn, startHarness, TEST_DATABASE_URL, type Client, type Harness } from './support/harness';
import { inProcessWorker, settle, until, upload } from './support/workflow';

const ROOT = path.resolve(__dirname, '../..');

function childWorker(extra: Record<string, string>): ChildProcess {
  return spawn(path.join(ROOT, 'node_modules/.bin/tsx'), ['server/jobs/worker.ts'], {
    cwd: ROOT,
    detached: true, // its own process group, so the kill reaches tsx's node child too
    stdio: 'ignore',
    env: { ...process.env, NODE_ENV: 'test', DATABASE_URL: TEST_DATABASE_URL, SMTP_URL: 'smtp://127.0.0.1:1', TRIMWIRE_SCAN_SWEEP_MS: '600000', ...extra },
  });
}

describe('scan worker crash and cancel', () => {
  let h: Harness;
  let designer: Client;
  let designId = '';
  let child: ChildProcess | undefined;
  let worker: RunningWorker | undefined;

  beforeAll(async () => {
    h = await startHarness();
    designer = await signIn(h.app, roleEmail('designer'));
    const res = await upload(designer, 'wren8-decoder.cir', { name: 'Decoder' });
    expect(res.status).toBe(201);
    designId = res.body.id;
  });
  afterAll(async () => {
    if (child?.pid && child.exitCode === null && child.signalCode === null) {
      try {
        process.kill(-child.pid, 'SIGKILL');
      } catch {
        // already gone
      }
    }
    await worker?.stop();
    await h?.close();
  });

  it('a scan whose worker is killed mid-scan is retried by another worker and finishes', async () => {
    child = childWorker({ TRIMWIRE_SCAN_STAGE_DELAY_MS: '1500', TRIMWIRE_SCAN_HEARTBEAT_MS: '300' });
    const started = await designer.agent.post(`/api/designs/${designId}/scans`).set('X-CSRF-Token', designer.csrf).send({}).expect(202);
    const id = started.body.id as string;
    const running = await until(() => h.db.models.Scan.findByPk(id), (s) => s?.status === 'running' && s.stage !== 'starting', 60_000, 'the child worker to start the scan', 150);
    expect(running!.attempts).toBe(1);
    process.kill(-child.pid!, 'SIGKILL');
    await until(async () => child!.exitCode !== null || child!.signalCode !== null, (x) => x, 10_000, 'the child to die', 150);
    // Nothing heartbeats any more: after the timeout the scan is stale, never "running" for good.
    worker = await inProcessWorker({ heartbeatTimeoutS: 2, sweepMs: 500 });
    const done = await settle(designer, id, 60_000);
    expect(done.status).toBe('done');
    expect(done.attempts).toBe(2);
    expect(done.progress).toBe(100);
  });

  it('a scan whose worker died on its last attempt fails with a message instead of running forever', async () => {
    const rev = await h.db.models.Revision.findOne({ where: { designId } });
    const s = await h.db.models.Scan.create({ designId, revisionId: rev!.id, revisionNumber: 1, rules: null, startedBy: null, engineVersion: 'test' });
    await h.db.sequelize.query(`UPDATE scans SET status = 'running', attempts = 3, heartbeat_at = now() - interval '1 hour' WHERE id = :id`, { replacements: { id: s.id } });
    const sent: string[] = [];
    const r = await sweepStaleScans(h.db, { heartbeatTimeoutS: 60, maxAttempts: 3, send: async (x) => void sent.push(x) });
    expect(r.failed).toContain(s.id);
    expect(sent).not.toContain(s.id);
    await s.reload();
    expect(s.status).toBe('failed');
    expect(s.error).toMatch(/stopped answering 3 time/);
  });

  it('a live scan is not swept (fresh heartbeat)', async () => {
    const rev = await h.db.models.Revision.findOne({ where: { designId } });
    const s = await h.db.models.Scan.create({ designId, revisionId: rev!.id, revisionNumber: 1, rules: null, startedBy: null, engineVersion: 'test' });
    await h.db.sequelize.query(`UPDATE scans SET status = 'running', attempts = 1, heartbeat_at = now(), worker = 'elsewhere' WHERE id = :id`, { replacements: { id: s.id } });
    const r = await sweepStaleScans(h.db, { heartbeatTimeoutS: 60, maxAttempts: 3, send: async () => undefined });
    expect(r.requeued).not.toContain(s.id);
    await s.reload();
    expect(s.status).toBe('running');
    await s.update({ status: 'failed' });
  });

  it('cancels a running scan (its worker polls the flag); a queued one at once', async () => {
    await worker?.stop();
    worker = await inProcessWorker({ stageDelayMs: 700 });
    const started = await designer.agent.post(`/api/designs/${designId}/scans`).set('X-CSRF-Token', designer.csrf).send({}).expect(202);
    await until(() => h.db.models.Scan.findByPk(started.body.id), (s) => s?.status === 'running', 30_000, 'the scan to run', 150);
    const c = await designer.agent.post(`/api/scans/${started.body.id}/cancel`).set('X-CSRF-Token', designer.csrf).expect(200);
    expect(c.body.cancelRequested).toBe(true);
    const end = await settle(designer, started.body.id, 30_000);
    expect(end.status).toBe('cancelled');
    expect(end.progress).toBeLessThan(100);
    const viewer = await signIn(h.app, roleEmail('viewer'));
    const r = await viewer.agent.post(`/api/scans/${started.body.id}/cancel`).set('X-CSRF-Token', viewer.csrf);
    expect(r.status).toBe(403);
  });
});
