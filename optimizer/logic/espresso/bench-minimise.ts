// Benchmark (prints a table; not a test): the minimise call a rule makes from truth tables —
// complement, table checks, name-free cache key, one batched round trip to the process pool (the
// child writes each PLA as one text), parsing, check against the truth table — against the bare
// native Espresso calls in-process on ready PLA text, on structured functions of 8–14 inputs.
// Both sides start from the same truth tables (building them from the design is the same for any
// minimiser, so it is outside both timings).
// Run: npx tsx optimizer/logic/espresso/bench-minimise.ts [--runs N] [--brief]   (npm run bench prints
// it twice: as placed, and under taskset on one processor; --brief leaves out the explanation)
import { spawn } from 'node:child_process';
import { createRequire } from 'node:module';
import os from 'node:os';
import { and, not, or, v } from '../expr';
import { complementTable, fromExprs, type TruthTable } from '../truth-table';
import { mapCover } from '../map-family';
import { createEspressoMinimiser, type EspressoMinimiser } from './espresso-minimiser';
import { buildPlaText } from './pla';

const requireNative = createRequire(__filename);
const native = requireNative('kuzzle-espresso-logic-minimizer') as { minimize(lines: string[]): string[] };

/** A sum of `terms` random products of 3–5 literals (seeded), the shape real control logic has. */
function structured(n: number, terms: number, seed: number): TruthTable {
  let s = seed >>> 0;
  // High bits only: the low bits of a power-of-two LCG cycle with tiny periods.
  const rnd = (k: number) => (((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) >>> 16) % k);
  const cubes = Array.from({ length: terms }, () => {
    const lits = new Map<number, number>();
    const size = 3 + rnd(3);
    while (lits.size < size) lits.set(rnd(n), rnd(2));
    return [...lits];
  });
  const inputs = Array.from({ length: n }, (_, i) => `I${i}`);
  const fn = or(...cubes.map((c) => and(...c.map(([i, val]) => (val ? v(inputs[i]) : not(v(inputs[i])))))));
  return fromExprs(inputs, [{ name: 'F', fn }]);
}

/** Processor time of this process so far (ms), every thread of it (the collector's and compiler's too). */
const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/**
 * Sizes measured: functions per batch, and rounds. Every round times both sides on the same
 * functions, interleaved in alternating order, so a burst of other work on a shared machine lands
 * on both alike; each round gives one overhead figure and the table reports their median and range.
 */
const SIZES = [
  { n: 8, batch: 64, rounds: 15 },
  { n: 10, batch: 32, rounds: 11 },
  { n: 12, batch: 8, rounds: 9 },
  { n: 14, batch: 3, rounds: 7 },
];

/** Processor time of `f` (ms): this process's, plus the child's for our side. */
const timed = async (f: () => unknown | Promise<unknown>, childCpu: () => number = () => 0): Promise<number> => {
  const ch0 = childCpu();
  const c0 = cpuMs();
  await f();
  return cpuMs() - c0 + (childCpu() - ch0);
};

/**
 * Ready PLA text of a function and of its complement, each as one array element: the native call
 * writes the elements to the file Espresso reads, so this gives Espresso the same file as a line
 * per element, with the least work in the bridge (the cheapest bare call, and no line strings
 * left in this process's heap to slow its collections).
 */
interface Pla {
  on: string[];
  off: string[];
}

/** The bare side: both native calls (function, complement) per function on ready PLA text. */
function bare(plas: readonly Pla[]): void {
  for (const p of plas) {
    native.minimize(p.on);
    native.minimize(p.off);
  }
}

/**
 * Our side, as the rule calls it: function and complement as one two-output table each, every
 * table of the batch in one minimiseMany. Nothing is answered from memory (the cache is cleared
 * first). Mapping the covers to gates follows the call (and is the same for any minimiser), so
 * it is outside the timing; `check` runs it after, on the answers.
 */
async function ours(m: EspressoMinimiser, tables: readonly TruthTable[]) {
  m.clearCache();
  const both = tables.map((t) => ({ inputs: t.inputs, outputs: [t.outputs[0], { ...complementTable(t).outputs[0], name: "F'" }] }));
  return m.minimiseMany(both);
}

function check(outcomes: Awaited<ReturnType<typeof ours>>): void {
  for (const o of outcomes) {
    if (!o.ok) throw o.error;
    const r = o.result;
    mapCover({ inputs: r.cover.inputs, outputs: [r.cover.outputs[0]] }, 'cmos', { complement: { inputs: r.cover.inputs, outputs: [{ ...r.cover.outputs[1], name: 'F' }] } });
  }
}

interface Round {
  bare: number;
  ours: number;
  aloneBare: number;
  alone: number;
  /** The stand-in's round trips less its busy time (see StandIn), summed like `alone`. */
  wake: number;
}

/**
 * The machine's share of the alone figure: a stand-in child, asked over the same kind of pipe
 * from the same event loop, that does nothing but stay busy for as long as the bare call of the
 * same function took, then answers. Both processes then sleep and wake as they do around a real
 * call (on this machine a wake costs more the longer the sleep), but nothing is minimised,
 * framed or checked: its processor time less the busy time is what any isolated call pays here.
 */
class StandIn {
  private readonly proc = spawn(
    process.execPath,
    [
      '-e',
      `const fs = require('fs'); const b = Buffer.alloc(8);
       for (;;) { if (fs.readSync(0, b, 0, 8, null) === 0) process.exit(0);
         const until = process.hrtime.bigint() + BigInt(Math.round(b.readDoubleLE(0) * 1000));
         while (process.hrtime.bigint() < until);
         const u = process.cpuUsage(); b.writeDoubleLE(u.user + u.system, 0); fs.writeSync(1, b, 0, 8); }`,
    ],
    { stdio: ['pipe', 'pipe', 'inherit'] },
  );
  private waiting: (() => void) | undefined;
  /** The child's processor time (ms) at its last answer, less the busy time it was asked for. */
  childCpu = 0;
  private busy = 0;

  constructor() {
    this.proc.stdout.on('data', (d: Buffer) => {
      this.childCpu = d.readDoubleLE(d.length - 8) / 1000 - this.busy;
      this.waiting?.();
    });
  }

  /** One round trip, the child busy for `ms`. */
  trip(ms: number): Promise<void> {
    return new Promise((resolve) => {
      this.waiting = resolve;
      this.busy += ms;
      const req = Buffer.alloc(8);
      req.writeDoubleLE(ms * 1000, 0);
      this.proc.stdin.write(req);
    });
  }

  close(): void {
    this.proc.kill();
  }
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/**
 * One round: the batch on both sides (one minimiseMany against the native calls in a loop), then
 * every function alone on both sides (its own minimiseMany against its own pair of native calls),
 * processor time summed over the batch. Our side counts this process and the child.
 */
async function round(m: EspressoMinimiser, standIn: StandIn, tables: readonly TruthTable[], plas: readonly Pla[], r: number): Promise<Round> {
  const childCpu = () => m.pool.childCpuMicros / 1000;
  const t: Round = { bare: 0, ours: 0, aloneBare: 0, alone: 0, wake: 0 };
  const batchBare = async () => (t.bare = await timed(() => bare(plas)));
  const batchOurs = async () => (t.ours = await timed(async () => check(await ours(m, tables)), childCpu));
  for (const step of r % 2 ? [batchOurs, batchBare] : [batchBare, batchOurs]) await step();
  for (let k = 0; k < tables.length; k++) {
    let bareMs = 0;
    const b = async () => (t.aloneBare += bareMs = await timed(() => bare(plas.slice(k, k + 1))));
    const o = async () => {
      let answer: Awaited<ReturnType<typeof ours>> = [];
      t.alone += await timed(async () => (answer = await ours(m, tables.slice(k, k + 1))), childCpu);
      check(answer);
    };
    const w = async () => (t.wake += await timed(() => standIn.trip(bareMs), () => standIn.childCpu));
    // The stand-in follows the bare call (it is busy that long); ours follows it every other time.
    for (const step of (r + k) % 2 ? [o, b, w] : [b, w, o]) await step();
  }
  return t;
}

/**
 * Calls of our side made before anything is timed. The wrapped call runs a few dozen JavaScript
 * functions in each process once per call, and the engine compiles them to optimised code only
 * after some thousands of calls (measured: the alone overhead at 8 inputs falls from 50–120 % over
 * the first thousand calls to its steady level after about two thousand). A scan makes one call
 * per batch of blocks, so a process that scans only a small design pays that start-up once, like
 * its own start; the table is the steady cost of each call after it.
 */
const WARM_CALLS = 2048;

async function warmUp(m: EspressoMinimiser, standIn: StandIn): Promise<void> {
  const n = SIZES[0].n;
  const tables = Array.from({ length: 64 }, (_, k) => structured(n, n, 99 + 1000 * k));
  const plas = tables.map((t) => ({ on: [buildPlaText(t.outputs[0], n)], off: [buildPlaText(complementTable(t).outputs[0], n)] }));
  for (let calls = 0; calls < WARM_CALLS; calls += tables.length + 1) await round(m, standIn, tables, plas, calls);
}

async function measure(m: EspressoMinimiser, standIn: StandIn, n: number, batch: number, rounds: number): Promise<string[]> {
  const tables = Array.from({ length: batch }, (_, k) => structured(n, n, 7 + n + 1000 * k));
  const plas = tables.map((t) => ({ on: [buildPlaText(t.outputs[0], n)], off: [buildPlaText(complementTable(t).outputs[0], n)] }));
  const terms = native.minimize(plas[0].on).length;
  // One untimed round first: both sides' code is compiled and the child has run this size.
  await round(m, standIn, tables, plas, 1);
  const all: Round[] = [];
  for (let r = 0; r < rounds; r++) all.push(await round(m, standIn, tables, plas, r));
  const pct = (x: number) => `${x.toFixed(0)}`;
  const spread = (xs: number[]) => `${pct(Math.min(...xs))}..${pct(Math.max(...xs))}`;
  const batched = all.map((x) => (x.ours / x.bare - 1) * 100);
  const alone = all.map((x) => (x.alone / x.aloneBare - 1) * 100);
  const wake = all.map((x) => (x.wake / x.aloneBare) * 100);
  return [
    String(n),
    String(batch),
    String(terms),
    String(rounds),
    (median(all.map((x) => x.bare)) / batch).toFixed(2),
    (median(all.map((x) => x.ours)) / batch).toFixed(2),
    pct(median(batched)),
    spread(batched),
    (median(all.map((x) => x.aloneBare)) / batch).toFixed(2),
    (median(all.map((x) => x.alone)) / batch).toFixed(2),
    pct(median(alone)),
    spread(alone),
    ((median(all.map((x) => x.wake)) / batch) * 1000).toFixed(0),
    pct(median(wake)),
  ];
}

async function main() {
  const at = process.argv.indexOf('--runs');
  const runs = at > 0 ? Math.max(1, Number(process.argv[at + 1]) || 1) : 1;
  const m = createEspressoMinimiser({ size: 1 });
  const standIn = new StandIn();
  const header = ['inputs', 'batch', 'terms', 'rounds', 'bare ms/fn', 'ours ms/fn', 'overhead %', 'range %', 'alone bare ms/fn', 'alone ours ms/fn', 'alone %', 'alone range %', 'wake µs', 'wake %'];
  const rows: string[][] = [header];
  const loads: string[] = [];
  try {
    await m.minimiseCover(structured(6, 2, 1)); // start the child outside the timings
    await warmUp(m, standIn);
    for (let run = 1; run <= runs; run++) {
      const before = os.loadavg()[0].toFixed(1);
      for (const { n, batch, rounds } of SIZES) rows.push(await measure(m, standIn, n, batch, rounds));
      loads.push(`run ${run}: load average ${before} before, ${os.loadavg()[0].toFixed(1)} after`);
      if (run < runs) rows.push(header.map(() => ''));
    }
  } finally {
    m.close();
    standIn.close();
  }
  const about = [
    'Processor time per function (function and complement minimised), this process and the child: the median of',
    `several rounds, after ${WARM_CALLS} untimed calls of our side (the engine's compile-on-use start-up, paid once`,
    'per process) and one untimed round of each size. Each round times both sides on the same functions,',
    'interleaved in alternating order; "range" is the least and greatest overhead of a round. bare: the two native',
    "Espresso calls in-process on ready PLA text (one array element each; the package's minimize(), whose bridge writes",
    'it to a new temporary file on disk per call). ours: complement, table checks, name-free cache key, the round',
    'trip to the child process (binary frames on its stdin and stdout; the child writes the PLA text from the table',
    'words into one in-memory file that the bridge reads by path), parsing and the check of each cover against the',
    'truth table. Espresso reads the same PLA text and does the same work on both sides. batch: the distinct',
    'functions of a size in one minimiseMany call, as a scan sends its blocks. alone: each function in a call of',
    'its own, as a scan of a small design sends its one block; its overhead is mostly the fixed cost of one round',
    "trip (each process sleeps and is woken once), which grows with the machine's other load. wake: that fixed",
    'cost alone, on this machine: a round trip from the same event loop to a stand-in child that only stays busy as',
    'long as the bare call took, less that busy time (both processes), per function and as a share of the alone',
    'bare time; alone % less wake % is what our own code adds. Goal: overhead under 30 % at 8–14 inputs, batched',
    'and alone.',
  ];
  if (!process.argv.includes('--brief')) for (const line of about) console.log(line);
  for (const l of loads) console.log(l);
  const widths = header.map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  for (const r of rows) console.log(r.map((x, c) => x.padStart(widths[c])).join('  '));
}

main().catch((e: unknown) => {
  console.error(e);
  process.exitCode = 1;
});
