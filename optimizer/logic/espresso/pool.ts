// A small pool of child processes running the native Espresso minimiser (worker.cjs). The native
// code is synchronous, may exit() on bad input and cannot share a process between threads, so
// each request goes to a child of its own: queued, timed out (the child is killed), and a child
// that dies or errs is replaced before it serves anything else.
import { fork, type ChildProcess } from 'node:child_process';
import path from 'node:path';

export const WORKER_PATH = path.join(__dirname, 'worker.cjs');

export type MinimiserFailure = 'timeout' | 'crashed' | 'rejected' | 'mismatch' | 'closed';

/** The minimiser process failed on one request; the pool itself keeps serving. */
export class MinimiserError extends Error {
  constructor(
    readonly reason: MinimiserFailure,
    message: string,
  ) {
    super(message);
    this.name = 'MinimiserError';
  }
}

interface Job {
  id: number;
  /** PLA texts (lines joined by "\n"). */
  batch: string[];
  timeoutMs: number;
  /** Cube texts, one per PLA. */
  resolve: (cubes: string[]) => void;
  reject: (err: Error) => void;
}

interface Slot {
  proc: ChildProcess;
  job?: Job;
  timer?: NodeJS.Timeout;
  stderr: string;
}

export interface PoolOptions {
  /** Children at most (default 2: the machines this runs on are small). */
  size?: number;
  /** Default per-request kill timeout. */
  timeoutMs?: number;
  /** Script to fork (tests substitute a misbehaving one). */
  workerPath?: string;
}

export class EspressoPool {
  private readonly size: number;
  private readonly defaultTimeout: number;
  private readonly workerPath: string;
  private readonly slots = new Set<Slot>();
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  /** Children started over the pool's life (tests read it to see restarts). */
  spawned = 0;

  constructor(options: PoolOptions = {}) {
    this.size = Math.max(1, options.size ?? 2);
    this.defaultTimeout = options.timeoutMs ?? 10_000;
    this.workerPath = options.workerPath ?? WORKER_PATH;
  }

  /** Sends PLA lines (already validated by the caller) and resolves with the cube lines. */
  run(lines: string[], timeoutMs = this.defaultTimeout): Promise<string[]> {
    return this.runBatch([lines], timeoutMs).then((r) => r[0]);
  }

  /** Several PLAs (as lines) in one round trip to one child (the timeout covers the whole batch). */
  runBatch(batch: string[][], timeoutMs = this.defaultTimeout): Promise<string[][]> {
    return this.runTexts(
      batch.map((lines) => lines.join('\n')),
      timeoutMs,
    ).then((texts) => texts.map((t) => (t === '' ? [] : t.split('\n'))));
  }

  /**
   * Several PLA texts (lines joined by "\n", already validated by the caller) in one round trip
   * to one child; resolves with one text of cube lines per PLA. One string per PLA each way keeps
   * the serialisation cost a small fraction of the minimiser's own time.
   */
  runTexts(batch: string[], timeoutMs = this.defaultTimeout): Promise<string[]> {
    if (this.closed) return Promise.reject(new MinimiserError('closed', 'the minimiser pool is closed'));
    return new Promise((resolve, reject) => {
      this.queue.push({ id: this.nextId++, batch, timeoutMs, resolve, reject });
      this.dispatch();
    });
  }

  /** Kills every child and fails queued requests. */
  close(): void {
    this.closed = true;
    for (const job of this.queue.splice(0)) job.reject(new MinimiserError('closed', 'the minimiser pool is closed'));
    for (const slot of [...this.slots]) this.retire(slot, new MinimiserError('closed', 'the minimiser pool is closed'));
  }

  get liveChildren(): number {
    return this.slots.size;
  }

  private dispatch(): void {
    while (this.queue.length > 0) {
      let slot = [...this.slots].find((s) => !s.job);
      if (!slot && this.slots.size < this.size) slot = this.spawn();
      if (!slot) return;
      const job = this.queue.shift()!;
      this.start(slot, job);
    }
  }

  private spawn(): Slot {
    // execArgv empty: the worker is plain CommonJS and must not inherit a TypeScript loader.
    const proc = fork(this.workerPath, [], { execArgv: [], stdio: ['ignore', 'ignore', 'pipe', 'ipc'], serialization: 'json' });
    this.spawned++;
    const slot: Slot = { proc, stderr: '' };
    this.slots.add(slot);
    proc.stderr?.on('data', (chunk: Buffer) => {
      slot.stderr = (slot.stderr + chunk.toString('utf8')).slice(-2000);
    });
    proc.on('message', (msg: { id: number; ok: boolean; cubes?: unknown[]; error?: string }) => {
      const job = slot.job;
      if (!job || msg.id !== job.id) return;
      this.finish(slot);
      if (msg.ok && Array.isArray(msg.cubes) && msg.cubes.length === job.batch.length && msg.cubes.every((c) => typeof c === 'string')) job.resolve(msg.cubes as string[]);
      else {
        // An error inside the native code may leave it in a bad state: replace the child.
        this.retire(slot);
        job.reject(new MinimiserError('rejected', `the minimiser rejected its input: ${msg.error ?? 'unknown error'}`));
      }
      this.dispatch();
    });
    const onGone = (code: number | null, signal: NodeJS.Signals | null) => {
      if (!this.slots.has(slot)) return;
      const job = slot.job;
      this.retire(slot);
      if (job) {
        const detail = slot.stderr.trim().split('\n').slice(-3).join(' | ');
        job.reject(new MinimiserError('crashed', `the minimiser process exited (${signal ?? `code ${code}`})${detail ? `: ${detail}` : ''}`));
      }
      this.dispatch();
    };
    proc.on('exit', onGone);
    proc.on('error', () => onGone(null, null));
    this.idle(slot);
    return slot;
  }

  private start(slot: Slot, job: Job): void {
    slot.job = job;
    slot.stderr = '';
    slot.proc.ref();
    (slot.proc.channel as { ref?: () => void } | undefined)?.ref?.();
    slot.timer = setTimeout(() => {
      this.retire(slot);
      job.reject(new MinimiserError('timeout', `the minimiser took longer than ${job.timeoutMs} ms and was stopped`));
      this.dispatch();
    }, job.timeoutMs);
    slot.proc.send({ id: job.id, batch: job.batch });
  }

  private finish(slot: Slot): void {
    if (slot.timer) clearTimeout(slot.timer);
    slot.timer = undefined;
    slot.job = undefined;
    this.idle(slot);
  }

  /** An idle child must not keep the host process alive (a CLI run ends when its work does). */
  private idle(slot: Slot): void {
    slot.proc.unref();
    (slot.proc.channel as { unref?: () => void } | undefined)?.unref?.();
  }

  private retire(slot: Slot, failPending?: Error): void {
    if (!this.slots.delete(slot)) return;
    if (slot.timer) clearTimeout(slot.timer);
    const job = slot.job;
    slot.job = undefined;
    slot.proc.removeAllListeners('message');
    if (slot.proc.exitCode === null && slot.proc.signalCode === null) slot.proc.kill('SIGKILL');
    if (job && failPending) job.reject(failPending);
  }
}
