// The engine thread pool without a database: a job run in a thread gives the same findings as the
// same job run in-process, with the minimise calls served by the main thread's minimiser (results
// and failures alike); stages come in order; a bad design comes back as a located input error; a
// job stopped in the middle of a blocking stage ends at once and the pool goes on with a new thread.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { exactMinimiser, type Minimiser } from '@/optimizer/logic/minimiser';
import { MinimiserError } from '@/optimizer/logic/espresso/pool';
import { RULES } from '@/optimizer/rules';
import { EnginePool, type EngineOutcome } from '@/server/jobs/engine-host';
import type { EngineJob } from '@/server/jobs/engine-protocol';
import { runEngineJob } from '@/server/jobs/engine-thread';

const DECK = 'wren8-decoder.cir';
const source = fs.readFileSync(path.resolve(__dirname, '../db/demo', DECK), 'utf8');
const job = (over: Partial<EngineJob> = {}): EngineJob => ({
  source,
  fileName: DECK,
  format: undefined,
  rules: Object.keys(RULES),
  assumptions: [],
  targetFamily: 'cmos',
  minimiser: null,
  stageDelayMs: 0,
  ...over,
});

/** The exact minimiser, counting the functions it is asked for. */
function counting(): Minimiser & { calls: number } {
  const m = {
    name: 'exact-counted',
    calls: 0,
    minimiseCover: (fn: Parameters<Minimiser['minimiseCover']>[0]) => {
      m.calls++;
      return exactMinimiser.minimiseCover(fn);
    },
  };
  return m;
}

const failing: Minimiser = {
  name: 'always-fails',
  minimiseCover: async () => {
    throw new MinimiserError('timeout', 'the minimiser took too long (test)');
  },
};

function result(o: EngineOutcome) {
  if (o.kind !== 'result') throw new Error(`expected a result, got ${JSON.stringify(o).slice(0, 400)}`);
  return o.result;
}

describe('engine thread pool', () => {
  const pools: EnginePool[] = [];
  const pool = (m?: Minimiser) => {
    const p = new EnginePool({ keep: 1, memoryMb: 1024, minimiser: m });
    pools.push(p);
    return p;
  };
  afterAll(() => pools.forEach((p) => p.close()));

  it('finds in a thread what the engine finds in-process, minimising through the main thread', async () => {
    const here = counting();
    const inProcess = await runEngineJob(job(), () => undefined, here);
    const there = counting();
    const stages: [string, number][] = [];
    const r = result(await pool(there).run(job(), (name, progress) => stages.push([name, progress])).outcome);
    expect(here.calls).toBeGreaterThan(0);
    expect(there.calls).toBe(here.calls);
    expect(r.findings.map((f) => f.proposals.map((p) => p.proposal.id))).toEqual(inProcess.findings.map((f) => f.proposals.map((p) => p.proposal.id)));
    expect(r.findings).toEqual(inProcess.findings);
    expect(r.ruleErrors).toEqual(inProcess.ruleErrors);
    expect(r.overlaps).toEqual(inProcess.overlaps);
    expect(stages.map(([n]) => n)).toEqual(['parse', 'flatten', 'extract', ...Object.keys(RULES).map((id) => `rule ${id}`)]);
    const percents = stages.map(([, p]) => p);
    expect(percents).toEqual([...percents].sort((a, b) => a - b));
    // Only the devices the proposals touch come back, each with its path.
    const touched = new Set(r.findings.flatMap((f) => f.proposals.flatMap((p) => [...p.proposal.edit.removeDevices, ...p.proposal.edit.reconnect.map((c) => c.device)])));
    expect(new Set(r.devices.map((d) => d.name))).toEqual(touched);
  });

  it('serves each scan from a minimiser session of its own, closed when the scan ends', async () => {
    const sessions: (Minimiser & { calls: number; closed: boolean })[] = [];
    const base: Minimiser = {
      name: 'exact-sessions',
      minimiseCover: () => Promise.reject(new Error('the base minimiser was called; each scan should use its own session')),
      session: () => {
        const s = Object.assign(counting(), { closed: false, close: () => void (s.closed = true) });
        sessions.push(s);
        return s;
      },
    };
    const p = pool(base);
    const first = result(await p.run(job({ rules: ['two-level-minimise'] }), () => undefined).outcome);
    const second = result(await p.run(job({ rules: ['two-level-minimise'] }), () => undefined).outcome);
    expect(first.ruleErrors).toEqual([]);
    expect(second.findings).toEqual(first.findings);
    expect(sessions).toHaveLength(2);
    expect(sessions.map((s) => s.closed)).toEqual([true, true]);
    expect(sessions[0].calls).toBeGreaterThan(0);
    expect(sessions[1].calls).toBe(sessions[0].calls);
  });

  it("passes the main thread's minimiser failures back as the same rule errors", async () => {
    const inProcess = await runEngineJob(job({ rules: ['two-level-minimise'] }), () => undefined, failing);
    const r = result(await pool(failing).run(job({ rules: ['two-level-minimise'] }), () => undefined).outcome);
    expect(inProcess.ruleErrors.length).toBeGreaterThan(0);
    expect(inProcess.ruleErrors.some((e) => /took too long \(test\)/.test(e.message))).toBe(true);
    expect(r.ruleErrors).toEqual(inProcess.ruleErrors);
  });

  it('returns a bad design as a located input error', async () => {
    const o = await pool().run(job({ source: 'broken deck\nQ1 c b\n.end\n' }), () => undefined).outcome;
    expect(o.kind).toBe('error');
    if (o.kind !== 'error') return;
    expect(o.error.input).toBe(true);
    expect(o.error.message).toMatch(/^wren8-decoder\.cir:2:\d+: .*Q1/);
  });

  it('stops a job inside a blocking stage at once, then runs the next job on a fresh thread', async () => {
    const p = pool();
    let started = 0;
    const run = p.run(job({ stageDelayMs: 30_000 }), () => void (started ||= Date.now()));
    while (!started) await new Promise((r) => setTimeout(r, 20));
    run.stop();
    expect(await run.outcome).toEqual({ kind: 'stopped' });
    expect(Date.now() - started).toBeLessThan(5_000);
    const next = result(await p.run(job({ rules: ['constant-input'] }), () => undefined).outcome);
    expect(next.timings).toHaveProperty('rule constant-input');
    // A stop that comes after its job ended leaves the thread's next job alone.
    run.stop();
    const after = p.run(job({ rules: ['constant-input'], stageDelayMs: 300 }), () => undefined);
    run.stop();
    expect(result(await after.outcome).timings).toHaveProperty('rule constant-input');
  });

  it('stops the running job when the pool closes, and runs nothing after', async () => {
    const p = pool();
    let started = false;
    const run = p.run(job({ stageDelayMs: 30_000 }), () => void (started = true));
    while (!started) await new Promise((r) => setTimeout(r, 20));
    p.close();
    expect(await run.outcome).toEqual({ kind: 'stopped' });
    expect(await p.run(job(), () => undefined).outcome).toEqual({ kind: 'stopped' });
  });
});
