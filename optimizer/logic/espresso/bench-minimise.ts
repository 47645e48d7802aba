// Benchmark (prints a table; not a test): the two-level path a rule takes from a truth table —
// complement, PLA text, validation, process-pool round trip, check against the truth table,
// family mapping — against the bare native Espresso calls in-process on ready PLA lines, on
// structured functions of 8–14 inputs. Both sides start from the same truth table (building it
// from the design's logic is the same for any minimiser, so it is outside both timings). Best of
// several repetitions, so other work on a shared machine inflates neither side much.
// Run: npx tsx optimizer/logic/espresso/bench-minimise.ts   (npm run bench prints it too)
import { createRequire } from 'node:module';
import { and, not, or, v } from '../expr';
import { complementTable, fromExprs } from '../truth-table';
import { mapCover } from '../map-family';
import { createEspressoMinimiser } from './espresso-minimiser';
import { buildPla } from './pla';

const requireNative = createRequire(__filename);
const native = requireNative('kuzzle-espresso-logic-minimizer') as { minimize(lines: string[]): string[] };

/** A sum of `terms` random products of 3–5 literals (seeded), the shape real control logic has. */
function structured(n: number, terms: number, seed: number) {
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

async function main() {
  const m = createEspressoMinimiser({ size: 1 });
  const rows: string[][] = [['inputs', 'terms', 'bare Espresso ms', 'two-level path ms', 'overhead %']];
  try {
    await m.minimiseCover(structured(6, 2, 1)); // start the child outside the timings
    for (const n of [8, 10, 12, 14]) {
      if (process.env.BENCH_TRACE) console.error('n', n);
      const t = structured(n, n, 7 + n);
      const lines = buildPla(t.outputs[0], n);
      const tc = complementTable(t);
      const linesC = buildPla(tc.outputs[0], n);
      const reps = n <= 10 ? 20 : n <= 12 ? 6 : 3;
      let bare = Infinity;
      let ours = Infinity;
      for (let r = 0; r < reps; r++) {
        let t0 = performance.now();
        const cubes = native.minimize(lines);
        native.minimize(linesC);
        bare = Math.min(bare, performance.now() - t0);
        const table = structured(n, n, 7 + n);
        t0 = performance.now();
        // The rule's path: function and complement in one request, check, map.
        const both = { inputs: table.inputs, outputs: [table.outputs[0], { ...complementTable(table).outputs[0], name: "F'" }] };
        const r2 = await m.minimiseCover(both);
        const on = { inputs: r2.cover.inputs, outputs: [r2.cover.outputs[0]] };
        const off = { inputs: r2.cover.inputs, outputs: [{ ...r2.cover.outputs[1], name: 'F' }] };
        mapCover(on, 'cmos', { complement: off });
        m.clearCache(); // time a fresh function every repetition
        ours = Math.min(ours, performance.now() - t0);
        if (r === 0) rows.push([String(n), String(cubes.length), '', '', '']);
      }
      const row = rows[rows.length - 1];
      row[2] = bare.toFixed(1);
      row[3] = ours.toFixed(1);
      row[4] = (((ours - bare) / bare) * 100).toFixed(0);
    }
  } finally {
    m.close();
  }
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  for (const r of rows) console.log(r.map((x, c) => x.padStart(widths[c])).join('  '));
}

main().catch((e: unknown) => { console.error(e); process.exitCode = 1; });
