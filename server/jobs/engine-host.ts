// The main-thread side of the scans' engine threads: a small pool of worker threads, each with a
// memory limit, that run one scan at a time. It passes each thread's stage reports on, answers its
// minimise calls from a session of the worker's Espresso minimiser (one per scan, see
// Minimiser.session), and turns every way a job can end — result,
// engine error, crash, out of memory, stopped — into one outcome. A thread's failure never reaches
// the worker process beyond that outcome; a stopped or dead thread is replaced by a fresh one.
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { minimiseAll, type Minimiser } from '@/optimizer/logic/minimiser';
import { wireError, type EngineFailure, type EngineJob, type EngineResult, type HostMessage, type ThreadMessage } from '@/server/jobs/engine-protocol';

/** The thread's entry: a CommonJS file, so it can set up TypeScript loading before the engine. */
export const ENGINE_ENTRY = path.join(__dirname, 'engine-thread.cjs');

export type EngineOutcome =
  | { kind: 'result'; result: EngineResult }
  /** The engine threw (a bad design, an assumption it cannot read, an engine bug). */
  | { kind: 'error'; error: EngineFailure; timings: Record<string, number> }
  /** The thread died: an uncaught error, out of memory, or an exit without a result. */
  | { kind: 'crashed'; message: string; cause?: unknown }
  /** stop() ended it. */
  | { kind: 'stopped' };

export type EnginePoolOptions = {
  /** Idle threads kept warm for the next scans (the worker's concurrency); 0 starts one per scan. */
  keep: number;
  /** V8 old-generation limit of each thread (resourceLimits.maxOldGenerationSizeMb). */
  memoryMb: number;
  /** The pool minimise calls are passed to; without one the threads use the engine's default. */
  minimiser?: Minimiser;
  /** Another entry file (tests use one that misbehaves on purpose). */
  entry?: string;
};

export type EngineRun = {
  outcome: Promise<EngineOutcome>;
  /** Terminates the job's thread at once, even in the middle of a synchronous stage. */
  stop: () => void;
};

type Job = {
  onStage: (name: string, progress: number, timings: Record<string, number>) => void;
  finish: (o: EngineOutcome, keepThread: boolean) => void;
  /** What serves this job's minimise calls: a session of the pool's minimiser where it has them. */
  minimiser?: Minimiser;
};

class EngineThread {
  readonly worker: Worker;
  job: Job | undefined;
  dead = false;

  constructor(
    private readonly pool: EnginePool,
    opts: EnginePoolOptions,
  ) {
    this.worker = new Worker(opts.entry ?? ENGINE_ENTRY, { resourceLimits: { maxOldGenerationSizeMb: opts.memoryMb } });
    const w = this.worker;
    const reply = (m: HostMessage) => {
      if (!this.dead) w.postMessage(m);
    };
    w.on('message', (m: ThreadMessage) => {
      const job = this.job;
      switch (m.type) {
        case 'stage':
          job?.onStage(m.name, m.progress, m.timings);
          break;
        case 'minimise':
          if (!job?.minimiser) {
            reply({ type: 'minimise-failed', id: m.id, error: { name: 'Error', message: job ? 'no minimiser in this worker' : 'the scan has ended' } });
            break;
          }
          // Batched when the pool can batch, one by one otherwise; each function fails on its own.
          minimiseAll(job.minimiser, m.fns, m.options).then(
            (outcomes) => reply({ type: 'minimised', id: m.id, outcomes: outcomes.map((o) => (o.ok ? o : { ok: false, error: wireError(o.error) })) }),
            (err: unknown) => reply({ type: 'minimise-failed', id: m.id, error: wireError(err) }),
          );
          break;
        case 'result':
          // A thread whose heap stayed large after a scan is not kept for the next one.
          job?.finish({ kind: 'result', result: m.result }, m.heapMb < opts.memoryMb / 2);
          break;
        case 'error':
          job?.finish({ kind: 'error', error: m.error, timings: m.timings }, m.heapMb < opts.memoryMb / 2);
          break;
      }
    });
    w.on('error', (err: Error & { code?: string }) => {
      this.died();
      const message =
        err.code === 'ERR_WORKER_OUT_OF_MEMORY'
          ? `the scan ran out of memory (the engine's limit is ${opts.memoryMb} MB, TRIMWIRE_SCAN_THREAD_MEMORY_MB); the design may be too large for this worker`
          : `the engine stopped unexpectedly: ${err.message}`;
      this.job?.finish({ kind: 'crashed', message, cause: err }, false);
    });
    w.on('exit', (code) => {
      this.died();
      this.job?.finish({ kind: 'crashed', message: `the engine stopped unexpectedly (thread exit code ${code}) before it finished` }, false);
    });
  }

  private died(): void {
    if (this.dead) return;
    this.dead = true;
    this.pool.forget(this);
  }

  /** Ends the thread (its 'exit' is then no news to anyone). */
  end(): void {
    this.job = undefined;
    this.died();
    void this.worker.terminate();
  }
}

export class EnginePool {
  private readonly idle: EngineThread[] = [];
  private readonly busy = new Set<EngineRun>();
  private closed = false;

  constructor(private readonly opts: EnginePoolOptions) {
    // Loading the engine in a thread costs about as much as a small scan: pay it before one is waiting.
    this.fill();
  }

  run(job: EngineJob, onStage: Job['onStage']): EngineRun {
    // A worker shutting down leaves the scan to the sweeper rather than failing it.
    if (this.closed) return { outcome: Promise.resolve({ kind: 'stopped' }), stop: () => undefined };
    let thread: EngineThread;
    try {
      thread = this.idle.pop() ?? new EngineThread(this, this.opts);
    } catch (err) {
      const message = `the engine thread could not start: ${err instanceof Error ? err.message : String(err)}`;
      return { outcome: Promise.resolve({ kind: 'crashed', message, cause: err }), stop: () => undefined };
    }
    thread.worker.ref();
    let settle: (o: EngineOutcome) => void = () => undefined;
    const outcome = new Promise<EngineOutcome>((resolve) => (settle = resolve));
    let settled = false;
    // Each scan gets a minimiser of its own (a fresh Espresso child, started on its first call), so
    // its covers depend on its own calls only, not on the scans this worker served before.
    const session = this.opts.minimiser?.session?.();
    const current: Job = {
      minimiser: session ?? this.opts.minimiser,
      onStage: (name, progress, timings) => {
        if (!settled) onStage(name, progress, timings);
      },
      finish: (o, keepThread) => {
        if (settled) return;
        settled = true;
        thread.job = undefined;
        session?.close();
        this.busy.delete(run);
        if (keepThread && !thread.dead) this.release(thread);
        else thread.end();
        this.fill();
        settle(o);
      },
    };
    thread.job = current;
    // Bound to this job: once it has ended, stop() is a no-op even if the thread runs another job.
    const run: EngineRun = { outcome, stop: () => current.finish({ kind: 'stopped' }, false) };
    this.busy.add(run);
    thread.worker.postMessage({ type: 'job', job: { ...job, minimiser: this.opts.minimiser ? this.opts.minimiser.name : null } } satisfies HostMessage);
    return run;
  }

  /**
   * Ends every thread now. The worker closes its pool after the queue's graceful stop, so a job
   * still running then is stopped: its scan keeps a heartbeat that goes stale, and the sweeper
   * hands it to another worker.
   */
  close(): void {
    this.closed = true;
    for (const t of this.idle.splice(0)) t.end();
    for (const r of [...this.busy]) r.stop();
  }

  /** Called by a thread that died or was ended: it is no longer offered. */
  forget(thread: EngineThread): void {
    const k = this.idle.indexOf(thread);
    if (k >= 0) this.idle.splice(k, 1);
  }

  private release(thread: EngineThread): void {
    if (this.closed || this.idle.length >= this.opts.keep) return thread.end();
    // An idle thread must not keep the process alive on its own.
    thread.worker.unref();
    this.idle.push(thread);
  }

  private fill(): void {
    while (!this.closed && this.idle.length < this.opts.keep) {
      const t = new EngineThread(this, this.opts);
      t.worker.unref();
      this.idle.push(t);
    }
  }
}
