// The engine side of a scan, run in a worker thread (started through engine-thread.cjs): for each
// job the host sends, parse → flatten → extract → each rule with its proofs, posting every stage to
// the main thread before it starts, and ending with the findings (or the error) as plain data. It
// never touches the database: the main thread keeps the heartbeat, watches cancel, stores results.
import { parentPort, type MessagePort } from 'node:worker_threads';
import { getHeapStatistics } from 'node:v8';
import { flatten, InputError, readDesign } from '@/optimizer';
import { extractLogic } from '@/optimizer/extract';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import type { Minimiser, MinimiseOptions, MinimiseOutcome } from '@/optimizer/logic/minimiser';
import type { TruthTable } from '@/optimizer/logic/truth-table';
import { MinimiserError, type MinimiserFailure } from '@/optimizer/logic/espresso/pool';
import { overlapGraph, type RuleErrorRecord } from '@/optimizer/rules/run-rules';
import { scan as scanRules, type ScannedFinding } from '@/optimizer/rules/scan';
import type { Design } from '@/optimizer/netlist/ir';
import type { Assumption } from '@/optimizer/rules/types';
import type { DevicePath, EngineFailure, EngineJob, EngineResult, HostMessage, ThreadMessage, WireError, WireOutcome } from '@/server/jobs/engine-protocol';

/**
 * The Espresso pool stays in the main thread and minimise calls are passed back to it, rather than
 * a pool created in here: the native minimiser runs in child processes, and a thread terminated on
 * cancel gets no chance to close its children, whereas the main thread's pool outlives every scan,
 * keeps its remembered covers across scans and is shared by concurrent scans. A call crosses the
 * thread boundary as plain data (the truth tables' words and the covers back), a whole batch per
 * message, cheap beside the child-process round trip it is already paying for.
 */
class HostCalls {
  private nextId = 1;
  private readonly pending = new Map<number, { resolve: (r: WireOutcome[]) => void; reject: (e: Error) => void }>();

  constructor(private readonly port: MessagePort) {}

  minimiser(name: string): Minimiser {
    const many = (fns: readonly TruthTable[], options?: MinimiseOptions) =>
      new Promise<WireOutcome[]>((resolve, reject) => {
        const id = this.nextId++;
        this.pending.set(id, { resolve, reject });
        this.port.postMessage({ type: 'minimise', id, fns: [...fns], options } satisfies ThreadMessage);
      }).then((outcomes) => outcomes.map((o): MinimiseOutcome => (o.ok ? o : { ok: false, error: errorOf(o.error) })));
    return {
      name,
      minimiseMany: many,
      async minimiseCover(fn, options) {
        const [outcome] = await many([fn], options);
        if (!outcome!.ok) throw outcome!.error;
        return outcome!.result;
      },
    };
  }

  answer(m: Extract<HostMessage, { id: number }>): void {
    const p = this.pending.get(m.id);
    if (!p) return;
    this.pending.delete(m.id);
    if (m.type === 'minimised') p.resolve(m.outcomes);
    else p.reject(errorOf(m.error));
  }
}

/** The rules read only the message; the pool's failures keep their class and reason. */
function errorOf(e: WireError): Error {
  if (e.name === 'MinimiserError') return new MinimiserError((e.reason ?? 'crashed') as MinimiserFailure, e.message);
  const err = new Error(e.message);
  err.name = e.name;
  return err;
}

/** A synchronous wait: the test knob must block this thread the way a long engine stage does. */
function blockFor(ms: number): void {
  if (ms > 0) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** Only the devices the proposals remove or reconnect: their paths are all the store looks up. */
function touchedDevices(findings: ScannedFinding[], devices: readonly { name: string; path: readonly string[] }[]): DevicePath[] {
  const names = new Set<string>();
  for (const f of findings) {
    for (const sp of f.proposals) {
      for (const n of sp.proposal.edit.removeDevices) names.add(n);
      for (const r of sp.proposal.edit.reconnect) names.add(r.device);
    }
  }
  return devices.filter((d) => names.has(d.name)).map((d) => ({ name: d.name, path: [...d.path] }));
}

/** Runs the job; `timings` fills in as stages finish (the caller reads it after an error too). */
export async function runEngineJob(
  job: EngineJob,
  post: (m: ThreadMessage) => void,
  minimiser?: Minimiser,
  timings: Record<string, number> = {},
): Promise<EngineResult> {
  const stage = async <T>(name: string, progress: number, step: () => T | Promise<T>): Promise<T> => {
    post({ type: 'stage', name, progress, timings: { ...timings } });
    blockFor(job.stageDelayMs);
    const t0 = performance.now();
    const out = await step();
    timings[name] = Math.round(performance.now() - t0);
    return out;
  };

  const assumptions: Assumption[] = job.assumptions.map((a) => ({ id: a.id, text: a.text, expr: parseExpr(a.text, `assumption ${a.id}`) }));
  let parsed: Design | undefined = await stage('parse', 5, () => readDesign(job.source, { file: job.fileName, format: job.format }).design);
  const flat = await stage('flatten', 10, () => flatten(parsed!));
  // The parsed cells are not needed past flattening; a large flat deck's would otherwise stay in
  // the heap through extraction and every rule (each collection walks them).
  parsed = undefined;
  const view = await stage('extract', 20, () => extractLogic(flat));
  const findings: ScannedFinding[] = [];
  const ruleErrors: RuleErrorRecord[] = [];
  for (const [k, ruleId] of job.rules.entries()) {
    const r = await stage(`rule ${ruleId}`, 20 + Math.round((70 * k) / job.rules.length), () =>
      scanRules(flat, { view, enabled: [ruleId], assumptions, minimiser, targetFamily: job.targetFamily, clockPeriod: job.clockPeriod }),
    );
    findings.push(...r.findings);
    ruleErrors.push(...r.ruleErrors);
  }
  const overlaps = overlapGraph(findings.map((f) => ({ ...f.finding, proposals: f.proposals.map((p) => p.proposal) })));
  return { findings, overlaps, ruleErrors, devices: touchedDevices(findings, flat.devices), timings };
}

export function failureOf(err: unknown): EngineFailure {
  if (err instanceof Error) return { input: err instanceof InputError, name: err.name, message: err.message, stack: err.stack };
  return { input: false, name: 'Error', message: String(err) };
}

const heapMb = () => Math.round(getHeapStatistics().used_heap_size / 2 ** 20);

/**
 * The thread's entry (called by engine-thread.cjs). The engine modules are loaded before the first
 * job arrives, so a kept thread starts its next scan warm; it runs one job at a time, as the host
 * sends them, and posts each one's end.
 */
export function startEngineThread(): void {
  const port = parentPort;
  if (!port) throw new Error('the scan engine runs in a worker thread');
  const calls = new HostCalls(port);
  const post = (m: ThreadMessage) => port.postMessage(m);
  port.on('message', (m: HostMessage) => {
    if (m.type !== 'job') return calls.answer(m);
    const { job } = m;
    const timings: Record<string, number> = {};
    runEngineJob(job, post, job.minimiser ? calls.minimiser(job.minimiser) : undefined, timings).then(
      (result) => post({ type: 'result', result, heapMb: heapMb() }),
      (err: unknown) => post({ type: 'error', error: failureOf(err), timings, heapMb: heapMb() }),
    );
  });
}
