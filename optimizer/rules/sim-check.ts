// Switch-level check of a rewrite (Bryant 1984 strengths): simulate the design before and after on
// the input vectors the proposal's assumptions allow, and report contention or floating reads the
// rewrite introduces, or a compared net whose value changes — what a pure logic proof cannot see
// (sneak paths, a shared node left floating).
import { evaluate, support } from '../logic/expr';
import type { FlatNetlist } from '../netlist/ir';
import { simulate } from '../verify/switch-sim';
import type { Assumption } from './types';

/** Exhaustive up to this many inputs; beyond it, a fixed pseudo-random sample. */
const EXHAUSTIVE_INPUTS = 8;
const SAMPLE = 256;

export interface SimCheck {
  vectors: number;
  /** First vector on which the rewrite shows a problem the original does not. */
  problem?: { vector: Record<string, 0 | 1>; kind: 'contention' | 'floating' | 'changed'; net: string; detail: string[] };
}

function vectorsFor(inputs: string[], assumptions: Assumption[], seed = 0x5eed): Record<string, 0 | 1>[] {
  const out: Record<string, 0 | 1>[] = [];
  const allowed = (v: Record<string, 0 | 1>) => assumptions.every((a) => evaluate(a.expr, v) === 1);
  if (inputs.length <= EXHAUSTIVE_INPUTS) {
    for (let m = 0; m < 2 ** inputs.length; m++) {
      const v = Object.fromEntries(inputs.map((x, i) => [x, ((m >> (inputs.length - 1 - i)) & 1) as 0 | 1]));
      if (allowed(v)) out.push(v);
    }
    return out;
  }
  let s = seed >>> 0;
  const next = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) >>> 16) & 1;
  for (let k = 0; k < SAMPLE * 4 && out.length < SAMPLE; k++) {
    const v = Object.fromEntries(inputs.map((x) => [x, next() as 0 | 1]));
    if (allowed(v)) out.push(v);
  }
  return out;
}

/**
 * @param inputs primary inputs and state bits the changed nets depend on (assumption variables
 *   outside them are filled in so every assumption can be evaluated).
 * @param compare compared nets as [name before, name after]: one that reads 0 or 1 before and
 *   anything else after on some vector is a problem too (joined emitters, say, letting one line
 *   reach ground through another stack).
 */
export function simulationCheck(before: FlatNetlist, after: FlatNetlist, inputs: string[], assumptions: Assumption[], compare: [string, string][] = []): SimCheck {
  const names = new Set(inputs);
  for (const a of assumptions) support(a.expr, names);
  const all = [...names].filter((n) => before.netByName.has(n) && after.netByName.has(n)).sort();
  const vectors = vectorsFor(all, assumptions);
  if (vectors.length === 0) return { vectors: 0 };
  const stimulus = { kind: 'vectors' as const, vectors: vectors };
  const b = simulate(before, stimulus, { watch: [...all.slice(0, 1), ...compare.map((c) => c[0])] });
  const a = simulate(after, stimulus, { watch: [...all.slice(0, 1), ...compare.map((c) => c[1])] });
  const had = new Set([...b.contention.map((c) => `c:${c.net}@${c.step}`), ...b.floatingReads.map((f) => `f:${f.net}@${f.step}`)]);
  const c = a.contention.find((x) => !had.has(`c:${x.net}@${x.step}`));
  if (c) return { vectors: vectors.length, problem: { vector: vectors[c.step], kind: 'contention', net: c.net, detail: c.drivers } };
  const f = a.floatingReads.find((x) => !had.has(`f:${x.net}@${x.step}`));
  if (f) return { vectors: vectors.length, problem: { vector: vectors[f.step], kind: 'floating', net: f.net, detail: f.readers } };
  for (let step = 0; step < vectors.length; step++) {
    for (const [bn, an] of compare) {
      const was = b.waveforms[bn]?.[step];
      const now = a.waveforms[an]?.[step];
      if ((was === 0 || was === 1) && now !== undefined && now !== was) {
        return { vectors: vectors.length, problem: { vector: vectors[step], kind: 'changed', net: bn, detail: [`${was} before`, `${now} after`] } };
      }
    }
  }
  return { vectors: vectors.length };
}
