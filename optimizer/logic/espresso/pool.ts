// A small pool of child processes running the native Espresso minimiser (worker.cjs). The native
// code is synchronous, may exit() on bad input and cannot share a process between threads, so
// each batch of PLAs goes to a child of its own: queued, timed out per PLA (the child is killed),
// and a child that dies or errs is replaced before it serves anything else.
import { spawn, type ChildProcessByStdio } from 'node:child_process';
import path from 'node:path';
import type { Readable, Writable } from 'node:stream';
import { encodeRequest, FrameError, ReplyReader, type PlaItem, type Reply } from './frames';

export type { PlaItem } from './frames';

export const WORKER_PATH = path.join(__dirname, 'worker.cjs');

/** Rough work of one item, for sharing a batch between children. */
const weight = (item: PlaItem) => (typeof item === 'string' ? item.length : (item.n + 3) * 2 ** item.n);

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

/** One call's PLAs and their answers; several jobs may serve it (a batch split between children, or retried). */
interface Request {
  texts: PlaItem[];
  answers: (string | MinimiserError | undefined)[];
  left: number;
  timeoutMs: number;
  /** Children that died serving this request since it last got an answer. */
  crashes: number;
  resolve: (answers: (string | MinimiserError)[]) => void;
}

interface Job {
  id: number;
  req: Request;
  /** Indices into the request's texts, in the order the child answers them. */
  items: number[];
  /** Items answered so far (a prefix of `items`). */
  got: number;
}

interface Slot {
  proc: ChildProcessByStdio<Writable, Readable, Readable>;
  job?: Job;
  /** The kill timer, kept across jobs (see arm); `timerAt` is when it fires. */
  timer?: NodeJS.Timeout;
  timerAt: number;
  /** When the running job's current item must be answered by (Date.now() time). */
  deadline: number;
  stderr: string;
  /** The child's processor time (µs) at its last message. */
  cpu: number;
}

/** Slack on a batch's timer: the child reports finished answers at least this often (child-frames.cjs). */
const FLUSH_SLACK_MS = 100;

/** Children in a row that may die on one request without answering anything before the rest of it fails too. */
const MAX_CRASHES = 3;

export interface PoolOptions {
  /** Children at most (default 2: the machines this runs on are small). */
  size?: number;
  /** Default per-request kill timeout. */
  timeoutMs?: number;
  /** Script the children run (tests substitute a misbehaving one). */
  workerPath?: string;
  /** Node options for the children (a profiler's, say); none by default. */
  execArgv?: string[];
}

export class EspressoPool {
  private readonly size: number;
  private readonly defaultTimeout: number;
  private readonly workerPath: string;
  private readonly execArgv: string[];
  private readonly slots = new Set<Slot>();
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  /** Children started over the pool's life (tests read it to see restarts). */
  spawned = 0;
  /** PLAs handed to children over the pool's life, retries included (tests read it to see de-duplication). */
  sent = 0;
  /** Processor time (µs) the children have reported using, summed over the pool's life (benchmarks read it). */
  childCpuMicros = 0;

  constructor(options: PoolOptions = {}) {
    this.size = Math.max(1, options.size ?? 2);
    this.defaultTimeout = options.timeoutMs ?? 10_000;
    this.workerPath = options.workerPath ?? WORKER_PATH;
    this.execArgv = options.execArgv ?? [];
  }

  /** Sends PLA lines (already validated by the caller) and resolves with the cube lines. */
  run(lines: string[], timeoutMs = this.defaultTimeout): Promise<string[]> {
    return this.runBatch([lines], timeoutMs).then((r) => r[0]);
  }

  /** Several PLAs (as lines) in one round trip; rejects with the first PLA's failure. */
  runBatch(batch: string[][], timeoutMs = this.defaultTimeout): Promise<string[][]> {
    return this.runTexts(
      batch.map((lines) => lines.join('\n')),
      timeoutMs,
    ).then((texts) => texts.map((t) => (t === '' ? [] : t.split('\n'))));
  }

  /** Several PLA texts (lines joined by "\n", already validated); rejects with the first failure among them. */
  async runTexts(batch: string[], timeoutMs = this.defaultTimeout): Promise<string[]> {
    const answers = await this.runEach(batch, timeoutMs);
    const failed = answers.find((a): a is MinimiserError => a instanceof MinimiserError);
    if (failed) throw failed;
    return answers as string[];
  }

  /**
   * Several PLAs (texts or table payloads, already validated by the caller), one answer each: the
   * cube lines as one text, or the failure of that PLA alone. The batch goes to the children in
   * as few round trips as there are children (one string per PLA each way); `timeoutMs` limits
   * each PLA's run. When a child hangs or dies mid-batch, the answers it gave are kept and the
   * unanswered PLAs are retried one by one on fresh children, so only the culprit fails.
   */
  runEach(batch: PlaItem[], timeoutMs = this.defaultTimeout): Promise<(string | MinimiserError)[]> {
    if (this.closed) return Promise.resolve(batch.map(() => new MinimiserError('closed', 'the minimiser pool is closed')));
    if (batch.length === 0) return Promise.resolve([]);
    return new Promise((resolve) => {
      const req: Request = { texts: batch, answers: new Array(batch.length), left: batch.length, timeoutMs, crashes: 0, resolve };
      for (const items of this.split(batch)) this.queue.push({ id: this.nextId++, req, items, got: 0 });
      this.dispatch();
    });
  }

  /** Kills every child and fails queued requests. */
  close(): void {
    this.closed = true;
    const err = () => new MinimiserError('closed', 'the minimiser pool is closed');
    for (const job of this.queue.splice(0)) this.failRest(job, err());
    for (const slot of [...this.slots]) {
      const job = slot.job;
      this.retire(slot);
      if (job) this.failRest(job, err());
    }
  }

  get liveChildren(): number {
    return this.slots.size;
  }

  /** Process ids of the live children (tests look at what they hold open). */
  get childPids(): number[] {
    return [...this.slots].map((s) => s.proc.pid).filter((pid): pid is number => pid !== undefined);
  }

  /** Contiguous shares of a batch, one per child the pool may run, balanced by their rough work. */
  private split(batch: PlaItem[]): number[][] {
    const parts = Math.min(this.size, batch.length);
    const all = batch.map((_, k) => k);
    if (parts <= 1) return [all];
    const total = batch.reduce((s, t) => s + weight(t), 0);
    const shares: number[][] = [];
    let cur: number[] = [];
    let acc = 0;
    for (const k of all) {
      cur.push(k);
      acc += weight(batch[k]);
      if (shares.length < parts - 1 && acc >= (total * (shares.length + 1)) / parts) {
        shares.push(cur);
        cur = [];
      }
    }
    if (cur.length) shares.push(cur);
    return shares;
  }

  private answer(req: Request, k: number, value: string | MinimiserError): void {
    if (req.answers[k] !== undefined) return;
    req.answers[k] = value;
    if (--req.left === 0) req.resolve(req.answers as (string | MinimiserError)[]);
  }

  /** Every item of the job not yet answered fails with `err`. */
  private failRest(job: Job, err: MinimiserError): void {
    for (let i = job.got; i < job.items.length; i++) this.answer(job.req, job.items[i], err);
    job.got = job.items.length;
  }

  /**
   * A job's child failed without naming the PLA at fault: one unanswered item is the culprit; with
   * several, each is retried alone (ahead of other work) so the failure lands on the right one.
   */
  private failUnknown(job: Job, err: MinimiserError): void {
    const rest = job.items.slice(job.got);
    if (rest.length === 1) this.answer(job.req, rest[0], err);
    else this.queue.unshift(...rest.map((k) => ({ id: this.nextId++, req: job.req, items: [k], got: 0 })));
    job.got = job.items.length;
  }

  private dispatch(): void {
    if (this.closed) {
      for (const job of this.queue.splice(0)) this.failRest(job, new MinimiserError('closed', 'the minimiser pool is closed'));
      return;
    }
    while (this.queue.length > 0) {
      let slot: Slot | undefined;
      for (const s of this.slots) if (!s.job) slot ??= s;
      if (!slot && this.slots.size < this.size) slot = this.spawn();
      if (!slot) return;
      const job = this.queue.shift()!;
      this.start(slot, job);
    }
  }

  private spawn(): Slot {
    // Bare node with no inherited options: the worker is plain CommonJS and must not inherit a
    // TypeScript loader. Requests and replies are binary frames on its stdin and stdout (frames.ts).
    const proc = spawn(process.execPath, [...this.execArgv, this.workerPath], { stdio: ['pipe', 'pipe', 'pipe'] });
    this.spawned++;
    const slot: Slot = { proc, stderr: '', cpu: 0, timerAt: 0, deadline: 0 };
    this.slots.add(slot);
    proc.stderr.on('data', (chunk: Buffer) => {
      slot.stderr = (slot.stderr + chunk.toString('utf8')).slice(-2000);
    });
    const reader = new ReplyReader((reply) => this.onReply(slot, reply));
    proc.stdout.on('data', (chunk: Buffer) => {
      if (!this.slots.has(slot)) return;
      try {
        reader.push(chunk);
      } catch (err) {
        if (!(err instanceof FrameError)) throw err;
        this.onBadFrame(slot, err.message);
      }
    });
    // A write to a child that has just died fails here; its 'close' reports the death.
    proc.stdin.on('error', () => {});
    const onGone = (code: number | null, signal: NodeJS.Signals | null) => {
      if (!this.slots.has(slot)) return;
      const job = slot.job;
      this.retire(slot);
      if (job) {
        const detail = slot.stderr.trim().split('\n').slice(-3).join(' | ');
        const err = new MinimiserError('crashed', `the minimiser process exited (${signal ?? `code ${code}`})${detail ? `: ${detail}` : ''}`);
        if (++job.req.crashes < MAX_CRASHES) this.failUnknown(job, err);
        else {
          // Children that die one after another without an answer (one that cannot start, say):
          // fail what is left of the request instead of starting a child per PLA.
          this.failRest(job, err);
          for (const queued of this.queue.filter((q) => q.req === job.req)) this.failRest(queued, err);
          this.queue.splice(0, this.queue.length, ...this.queue.filter((q) => q.req !== job.req));
        }
      }
      this.dispatch();
    };
    // 'close' rather than 'exit': it comes after the last of stdout and stderr is read, so answers
    // written just before a crash are kept and the crash message is whole.
    proc.on('close', onGone);
    proc.on('error', () => onGone(null, null));
    // An idle child must not keep the host process alive (a CLI run ends when its work does);
    // while a job runs, its kill timer does.
    proc.unref();
    for (const stream of [proc.stdin, proc.stdout, proc.stderr]) (stream as unknown as { unref?: () => void }).unref?.();
    return slot;
  }

  /** A reply that cannot be read leaves the stream out of step: the child is replaced. */
  private onBadFrame(slot: Slot, detail: string): void {
    const job = slot.job;
    this.retire(slot);
    if (job) this.failUnknown(job, new MinimiserError('rejected', `the minimiser rejected its input: a malformed answer (${detail})`));
    this.dispatch();
  }

  private onReply(slot: Slot, msg: Reply): void {
    const job = slot.job;
    if (!job || msg.id !== job.id) return;
    if (msg.cpu >= slot.cpu) {
      this.childCpuMicros += msg.cpu - slot.cpu;
      slot.cpu = msg.cpu;
    }
    // Answers arrive in order, each reply continuing where the last one stopped.
    const { from, cubes } = msg;
    const wellFormed = from === job.got && from + cubes.length <= job.items.length;
    if (wellFormed) {
      for (let i = 0; i < cubes.length; i++) this.answer(job.req, job.items[from + i], cubes[i]);
      job.got = from + cubes.length;
      if (cubes.length) job.req.crashes = 0;
    }
    if (msg.ok && wellFormed) {
      if (job.got === job.items.length) this.finish(slot);
      else this.arm(slot, job); // progress: the next PLA gets its full time
      if (!slot.job) this.dispatch();
      return;
    }
    // An error inside the native code may leave it in a bad state: replace the child.
    this.retire(slot);
    const err = new MinimiserError('rejected', `the minimiser rejected its input: ${(msg.ok ? 'a malformed answer' : msg.error) ?? 'unknown error'}`);
    if (!msg.ok && wellFormed && msg.at === job.got && job.got < job.items.length) {
      // The child named the PLA at fault: it alone fails, the rest go on as a batch.
      this.answer(job.req, job.items[job.got], err);
      const rest = job.items.slice(job.got + 1);
      job.got = job.items.length;
      if (rest.length) this.queue.unshift({ id: this.nextId++, req: job.req, items: rest, got: 0 });
    } else this.failUnknown(job, err);
    this.dispatch();
  }

  /**
   * Sets the running job's deadline. The timer is not remade for every job: one that would fire
   * no later than the deadline is kept (referenced while a job runs) and, when it fires early,
   * waits out the rest of the current deadline; a round trip then costs no timer list work.
   */
  private arm(slot: Slot, job: Job): void {
    const limit = job.req.timeoutMs + (job.items.length > 1 ? FLUSH_SLACK_MS : 0);
    const now = Date.now();
    slot.deadline = now + limit;
    if (slot.timer && slot.timerAt <= slot.deadline) {
      slot.timer.ref();
      return;
    }
    if (slot.timer) clearTimeout(slot.timer);
    this.setTimer(slot, limit, now);
  }

  private setTimer(slot: Slot, ms: number, now: number): void {
    slot.timerAt = now + ms;
    slot.timer = setTimeout(() => {
      slot.timer = undefined;
      const job = slot.job;
      if (!job || !this.slots.has(slot)) return;
      const now = Date.now();
      const left = slot.deadline - now;
      if (left > 0) {
        this.setTimer(slot, left, now);
        return;
      }
      this.retire(slot);
      this.failUnknown(job, new MinimiserError('timeout', `the minimiser took longer than ${job.req.timeoutMs} ms and was stopped`));
      this.dispatch();
    }, ms);
  }

  private start(slot: Slot, job: Job): void {
    slot.job = job;
    slot.stderr = '';
    this.arm(slot, job);
    this.sent += job.items.length;
    slot.proc.stdin.write(encodeRequest(job.id, job.items.map((k) => job.req.texts[k])));
  }

  private finish(slot: Slot): void {
    // An idle child's timer stays set but must not keep the host process alive.
    slot.timer?.unref();
    slot.job = undefined;
  }

  private retire(slot: Slot): void {
    if (!this.slots.delete(slot)) return;
    if (slot.timer) clearTimeout(slot.timer);
    slot.timer = undefined;
    slot.job = undefined;
    if (slot.proc.exitCode === null && slot.proc.signalCode === null) slot.proc.kill('SIGKILL');
  }
}
