// The scan's engine runs in a worker thread, so the worker's main thread stays free during a long
// stage: the stage-delay knob (TRIMWIRE_SCAN_STAGE_DELAY_MS) blocks the engine thread synchronously,
// as a long extraction or proof would, and meanwhile the heartbeat keeps moving and a cancel ends the
// scan at once. A thread that throws, exits or runs out of memory fails only its scan; the worker
// goes on to the next. A design the engine refuses fails with the engine's located message. The
// thread loads TypeScript both under vitest (in-process workers) and under tsx (a worker process).
import { spawn } from 'node:child_process';
import path from 'node:path';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { startWorker, type RunningWorker, type WorkerOptions } from '@/server/jobs/worker';
import { roleEmail, signIn, startHarness, TEST_DATABASE_URL, type Client, type Harness } from './support/harness';
import { demoDeck, settle, until, upload } from './support/workflow';

const ROOT = path.resolve(__dirname, '../..');
const MISBEHAVING_ENGINE = path.join(__dirname, 'support/misbehaving-engine.cjs');
const DECK = 'wren8-decoder.cir';
/** Two quick rules keep the many-stage tests short; every stage still goes through the thread. */
const RULES = ['constant-input', 'double-inversion'];

/** The demo deck with a marker comment under its title line (read by misbehaving-engine.cjs). */
function markedDeck(marker: string): string {
  const [title, ...rest] = demoDeck(DECK).toString('utf8').split('\n');
  return [title, `* engine-test: ${marker}`, ...rest].join('\n');
}

describe('scan engine thread', () => {
  let h: Harness;
  let designer: Client;
  let designId = '';
  let worker: RunningWorker | undefined;

  const startScan = async (id = designId, rules: string[] | undefined = RULES) => {
    const res = await designer.agent.post(`/api/designs/${id}/scans`).set('X-CSRF-Token', designer.csrf).send(rules ? { rules } : {});
    expect(res.status, JSON.stringify(res.body)).toBe(202);
    return res.body.id as string;
  };
  const row = (id: string) => h.db.models.Scan.findByPk(id);
  const work = async (settings: WorkerOptions['settings'], engineEntry?: string) => {
    worker = await startWorker({
      databaseUrl: TEST_DATABASE_URL,
      settings: { stageDelayMs: 0, heartbeatMs: 200, heartbeatTimeoutS: 120, sweepMs: 60_000, maxAttempts: 3, concurrency: 1, cancelPollMs: 200, threadMemoryMb: 4096, ...settings },
      engineEntry,
      log: () => undefined,
    });
  };

  beforeAll(async () => {
    h = await startHarness();
    designer = await signIn(h.app, roleEmail('designer'));
    const res = await upload(designer, DECK, { name: 'Decoder' });
    expect(res.status).toBe(201);
    designId = res.body.id;
  });
  afterEach(async () => {
    await worker?.stop();
    worker = undefined;
  });
  afterAll(async () => {
    await h?.close();
  });

  // First: the models are bound to the database the last worker opened, so this test runs before any
  // in-process worker is started and stopped.
  it('runs the engine thread in a worker process started with tsx, as npm start starts it', async () => {
    const child = spawn(path.join(ROOT, 'node_modules/.bin/tsx'), ['server/jobs/worker.ts'], {
      cwd: ROOT,
      detached: true, // its own process group, so the kill below reaches tsx's node child too
      stdio: 'ignore',
      env: { ...process.env, NODE_ENV: 'test', DATABASE_URL: TEST_DATABASE_URL, SMTP_URL: 'smtp://127.0.0.1:1', TRIMWIRE_SCAN_SWEEP_MS: '600000' },
    });
    try {
      const id = await startScan();
      const done = await settle(designer, id, 90_000);
      expect(done.status).toBe('done');
      expect(done.progress).toBe(100);
      expect((await row(id))!.timings).toHaveProperty('rule double-inversion');
    } finally {
      process.kill(-child.pid!, 'SIGKILL');
    }
  });

  it('keeps writing heartbeats while a stage blocks the engine thread, and finishes', async () => {
    await work({ stageDelayMs: 2500 });
    const id = await startScan();
    const first = await until(() => row(id), (s) => s?.stage === 'parse', 60_000, 'the parse stage');
    const beats = new Set<number>([first!.heartbeatAt!.getTime()]);
    // Well inside the blocked parse stage (2.5 s): the heartbeat (every 0.2 s) must move on its own.
    const end = Date.now() + 1500;
    while (Date.now() < end) {
      const s = await row(id);
      if (s?.stage !== 'parse') break;
      beats.add(s.heartbeatAt!.getTime());
      await new Promise((r) => setTimeout(r, 100));
    }
    expect((await row(id))?.stage).toBe('parse');
    expect(beats.size).toBeGreaterThanOrEqual(4);
    const done = await settle(designer, id, 90_000);
    expect(done.status).toBe('done');
    expect(done.progress).toBe(100);
    expect(done.attempts).toBe(1);
    const stored = await row(id);
    // Timings come back from the thread: the engine's stages (the delay excluded) and the store.
    expect(Object.keys(stored!.timings ?? {})).toEqual(expect.arrayContaining(['parse', 'flatten', 'extract', 'rule constant-input', 'rule double-inversion', 'store']));
    expect((stored!.timings as Record<string, number>).parse).toBeLessThan(2500);
  });

  it('cancels at once in the middle of a stage that blocks the engine thread', async () => {
    await work({ stageDelayMs: 30_000 });
    const id = await startScan();
    await until(() => row(id), (s) => s?.stage === 'parse', 60_000, 'the parse stage');
    const asked = Date.now();
    await designer.agent.post(`/api/scans/${id}/cancel`).set('X-CSRF-Token', designer.csrf).expect(200);
    const end = await until(() => row(id), (s) => s?.status !== 'running', 10_000, 'the cancel');
    // Far sooner than the 30 s the stage would block: the thread was terminated, not waited for.
    expect(Date.now() - asked).toBeLessThan(8_000);
    expect(end!.status).toBe('cancelled');
    expect(end!.stage).toBe('cancelled');
    expect(end!.progress).toBeLessThan(100);
  });

  it('fails a scan whose thread throws, exits or runs out of memory, and goes on to the next scan', async () => {
    await work({ threadMemoryMb: 256 }, MISBEHAVING_ENGINE);
    const ids: Record<string, string> = {};
    for (const marker of ['throw', 'exit', 'exhaust-memory']) {
      const up = await upload(designer, DECK, { name: `Decoder ${marker}` }, markedDeck(marker));
      expect(up.status, JSON.stringify(up.body)).toBe(201);
      ids[marker] = await startScan(up.body.id);
      const failed = await settle(designer, ids[marker]!, 90_000);
      expect(failed.status, marker).toBe('failed');
      expect(failed.stage).toBe('failed');
    }
    expect((await row(ids.throw!))!.error).toMatch(/engine stopped unexpectedly: engine-test fault in the engine thread/);
    expect((await row(ids.exit!))!.error).toMatch(/thread exit code 7/);
    expect((await row(ids['exhaust-memory']!))!.error).toMatch(/ran out of memory \(the engine's limit is 256 MB/);
    // The same worker process, with a fresh thread, scans the next design to the end.
    const next = await startScan(designId, undefined);
    const done = await settle(designer, next, 90_000);
    expect(done.status).toBe('done');
    expect(done.progress).toBe(100);
  });

  it("fails a scan with the engine's located message when the thread's engine refuses its input", async () => {
    await work({});
    const up = await upload(designer, DECK, { name: 'Decoder with a damaged assumption' });
    expect(up.status).toBe(201);
    // The API refuses such an expression; a row damaged behind its back is what this guards against.
    const bad = await h.db.models.Assumption.create({ designId: up.body.id, expression: 'A0 & (A1 |', justification: 'damaged row', ownerId: null });
    const id = await startScan(up.body.id);
    const failed = await settle(designer, id, 90_000);
    expect(failed.status).toBe('failed');
    expect((await row(id))!.error).toMatch(new RegExp(`^assumption ${bad.id}:1:\\d+: `));
  });
});
