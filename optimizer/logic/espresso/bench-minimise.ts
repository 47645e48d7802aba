// Benchmark (prints a table; not a test): the minimise call a rule makes from truth tables —
// complement, table checks, one batched round trip to the process pool (the child writes the PLA
// rows), parsing, check against the truth table — against the bare native Espresso calls
// in-process on ready PLA lines, on structured functions of 8–14 inputs. Both sides start from the same truth tables
// (building them from the design is the same for any minimiser, so it is outside both timings).
// Run: npx tsx optimizer/logic/espresso/bench-minimise.ts   (npm run bench prints it too)
import { createRequire } from 'node:module';
import { and, not, or, v } from '../expr';
import { complementTable, fromExprs, type TruthTable } from '../truth-table';
import { mapCover } from '../map-family';
import { createEspressoMinimiser, type EspressoMinimiser } from './espresso-minimiser';
import { buildPla } from './pla';

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

const cpuMs = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

/** Sizes measured: functions per batch and repetitions (best kept), fewer where one call is long. */
const SIZES = [
  { n: 8, batch: 64, reps: 30 },
  { n: 10, batch: 32, reps: 15 },
  { n: 12, batch: 8, reps: 6 },
  { n: 14, batch: 3, reps: 5 },
];

interface Times {
  cpu: number;
  wall: number;
}

/** The bare side: both native calls (function, complement) per function on ready PLA lines. */
function bare(plas: { on: string[]; off: string[] }[]): Times {
  const c0 = cpuMs();
  const w0 = performance.now();
  for (const p of plas) {
    native.minimize(p.on);
    native.minimize(p.off);
  }
  return { cpu: cpuMs() - c0, wall: performance.now() - w0 };
}

/**
 * Our side, as the rule calls it: function and complement as one two-output table each, every
 * table of the batch in one minimiseMany. Processor time is this process's plus what the Espresso
 * child reports using over the same span. Mapping the covers to gates follows the call (and is
 * the same for any minimiser), so it is outside the timing; it runs after, as a check of the answers.
 */
async function ours(m: EspressoMinimiser, tables: TruthTable[]): Promise<Times> {
  m.clearCache(); // fresh functions every repetition: nothing answered from memory
  const child0 = m.pool.childCpuMicros;
  const c0 = cpuMs();
  const w0 = performance.now();
  const both = tables.map((t) => ({ inputs: t.inputs, outputs: [t.outputs[0], { ...complementTable(t).outputs[0], name: "F'" }] }));
  const outcomes = await m.minimiseMany(both);
  const wall = performance.now() - w0;
  const cpu = cpuMs() - c0 + (m.pool.childCpuMicros - child0) / 1000;
  for (const o of outcomes) {
    if (!o.ok) throw o.error;
    const r = o.result;
    mapCover({ inputs: r.cover.inputs, outputs: [r.cover.outputs[0]] }, 'cmos', { complement: { inputs: r.cover.inputs, outputs: [{ ...r.cover.outputs[1], name: 'F' }] } });
  }
  return { cpu, wall };
}

async function main() {
  const m = createEspressoMinimiser({ size: 1 });
  const header = ['inputs', 'batch', 'terms', 'bare cpu ms/fn', 'ours cpu ms/fn', 'overhead cpu %', 'bare wall ms/fn', 'ours wall ms/fn', 'overhead wall %', 'alone wall %'];
  const rows: string[][] = [header];
  try {
    await m.minimiseCover(structured(6, 2, 1)); // start the child outside the timings
    for (const { n, batch, reps } of SIZES) {
      const tables = Array.from({ length: batch }, (_, k) => structured(n, n, 7 + n + 1000 * k));
      const plas = tables.map((t) => ({ on: buildPla(t.outputs[0], n), off: buildPla(complementTable(t).outputs[0], n) }));
      const terms = native.minimize(plas[0].on).length;
      const best = { bare: { cpu: Infinity, wall: Infinity }, ours: { cpu: Infinity, wall: Infinity }, alone: Infinity, aloneBare: Infinity };
      const keep = (into: Times, t: Times) => {
        into.cpu = Math.min(into.cpu, t.cpu);
        into.wall = Math.min(into.wall, t.wall);
      };
      for (let r = 0; r < reps; r++) {
        keep(best.bare, bare(plas));
        keep(best.ours, await ours(m, tables));
        // One function per round trip (not how the rule calls it): what batching saves.
        best.aloneBare = Math.min(best.aloneBare, bare(plas.slice(0, 1)).wall);
        best.alone = Math.min(best.alone, (await ours(m, tables.slice(0, 1))).wall);
      }
      const pct = (a: number, b: number) => (((a - b) / b) * 100).toFixed(0);
      rows.push([
        String(n),
        String(batch),
        String(terms),
        (best.bare.cpu / batch).toFixed(2),
        (best.ours.cpu / batch).toFixed(2),
        pct(best.ours.cpu, best.bare.cpu),
        (best.bare.wall / batch).toFixed(2),
        (best.ours.wall / batch).toFixed(2),
        pct(best.ours.wall, best.bare.wall),
        pct(best.alone, best.aloneBare),
      ]);
    }
  } finally {
    m.close();
  }
  console.log('per function (function and complement minimised), best of several repetitions; a batch of distinct');
  console.log('functions of each size goes in one minimiseMany call, as a scan sends its blocks.');
  console.log('bare: the two native Espresso calls in-process on ready PLA lines. ours: complement, table checks,');
  console.log('the round trip to the child process (which writes the PLA rows), parsing and the check of each cover');
  console.log('against the truth table; cpu counts this process and the child. alone: one function per round trip.');
  const widths = header.map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  for (const r of rows) console.log(r.map((x, c) => x.padStart(widths[c])).join('  '));
}

main().catch((e: unknown) => {
  console.error(e);
  process.exitCode = 1;
});
