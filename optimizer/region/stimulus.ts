// Stimulus for a region's waveforms: the inputs the region's nets depend on, a default set of
// vectors the assumptions allow, and a small text form (vectors or a clocked sequence) to edit it.
import { InputError } from '../errors';
import { combinationalModel } from '../extract/compose';
import { extractLogic } from '../extract';
import { evaluate, support } from '../logic/expr';
import type { FlatNetlist } from '../netlist/ir';
import type { Assumption } from '../rules/types';
import type { Stimulus } from '../verify/switch-sim';
import type { RegionGraph } from './graph';

/** Exhaustive up to this many inputs (64 vectors); beyond, a fixed pseudo-random sample. */
export const EXHAUSTIVE_INPUTS = 6;
export const SAMPLE_VECTORS = 48;

/**
 * Primary inputs and state bits the region's driven nets depend on (sorted), plus any region net
 * that nothing in the design drives (a port the outside world sets).
 */
export function regionInputs(nl: FlatNetlist, region: RegionGraph): string[] {
  const view = extractLogic(nl);
  const rails = new Set(region.nets.filter((n) => n.railVolts !== undefined).map((n) => n.name));
  const names = region.nets.map((n) => n.name).filter((n) => !rails.has(n) && nl.netByName.has(n));
  const driven = names.filter((n) => view.nodeByNet.has(nl.netByName.get(n)!));
  const model = combinationalModel(view, driven);
  const deps = new Set<string>();
  for (const e of Object.values(model.outputs)) support(e, deps);
  const primary = new Set([...view.inputs, ...view.stateBits]);
  for (const n of names) if (primary.has(n)) deps.add(n);
  return [...deps].filter((n) => nl.netByName.has(n) && !rails.has(n)).sort();
}

const allowedBy = (assumptions: readonly Assumption[]) => (v: Record<string, 0 | 1>) =>
  assumptions.every((a) => {
    for (const name of support(a.expr)) if (!(name in v)) return true; // not about these inputs
    return evaluate(a.expr, v) === 1;
  });

/**
 * Vectors over `inputs` (plus the assumptions' own variables) that every assumption allows:
 * all of them up to EXHAUSTIVE_INPUTS inputs, else a fixed sample (same seed → same vectors).
 */
export function defaultStimulus(inputs: readonly string[], assumptions: readonly Assumption[], seed = 0x5eed): Stimulus {
  const names = new Set(inputs);
  for (const a of assumptions) support(a.expr, names);
  const all = [...names].sort();
  const allowed = allowedBy(assumptions);
  const vectors: Record<string, 0 | 1>[] = [];
  if (all.length <= EXHAUSTIVE_INPUTS) {
    for (let m = 0; m < 2 ** all.length; m++) {
      const v = Object.fromEntries(all.map((x, i) => [x, ((m >> (all.length - 1 - i)) & 1) as 0 | 1]));
      if (allowed(v)) vectors.push(v);
    }
  } else {
    let s = seed >>> 0;
    const bit = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) >>> 16) & 1;
    for (let k = 0; k < SAMPLE_VECTORS * 8 && vectors.length < SAMPLE_VECTORS; k++) {
      const v = Object.fromEntries(all.map((x) => [x, bit() as 0 | 1]));
      if (allowed(v)) vectors.push(v);
    }
  }
  return { kind: 'vectors', vectors };
}

/** Steps of a stimulus that break an assumption, as sentences (empty when all are allowed). */
export function stimulusProblems(st: Stimulus, assumptions: readonly Assumption[]): string[] {
  const problems: string[] = [];
  st.vectors.forEach((vec, k) => {
    if (Object.values(vec).some((x) => x === 'X')) return; // an unknown input is not a claim
    const v = vec as Record<string, 0 | 1>;
    for (const a of assumptions) {
      if (![...support(a.expr)].every((n) => n in v)) continue;
      if (evaluate(a.expr, v) !== 1) problems.push(`step ${k + 1} breaks the assumption "${a.text}"`);
    }
  });
  return problems;
}

/** Text form: one step a line, `NAME=0 NAME=1 …`; a first line `clock NAME` makes it clocked. */
export function stimulusToText(st: Stimulus): string {
  const lines = st.vectors.map((v) => Object.entries(v).map(([k, x]) => `${k}=${x}`).join(' '));
  return (st.kind === 'clocked' ? [`clock ${st.clock}`, ...lines] : lines).join('\n');
}

export const MAX_STEPS = 512;

/** Parses the text form; errors name line and column ("stimulus:3:5"). */
export function parseStimulusText(text: string, file = 'stimulus'): Stimulus {
  const raw = text.split(/\r?\n/);
  let clock: string | undefined;
  const vectors: Record<string, 0 | 1 | 'X'>[] = [];
  raw.forEach((line, i) => {
    const body = line.replace(/#.*$/, '');
    if (!body.trim()) return;
    const m = /^\s*clock\s+(\S+)\s*$/i.exec(body);
    if (m) {
      if (vectors.length || clock) throw InputError.at('stimulus.clock', 'the clock line must come first, once', { file, line: i + 1, col: 1 });
      clock = m[1];
      return;
    }
    const vec: Record<string, 0 | 1 | 'X'> = {};
    for (const tok of body.matchAll(/\S+/g)) {
      const t = /^([^=\s]+)=([01xX])$/.exec(tok[0]);
      if (!t) throw InputError.at('stimulus.syntax', `expected NAME=0, NAME=1 or NAME=X, found "${tok[0]}"`, { file, line: i + 1, col: (tok.index ?? 0) + 1 });
      vec[t[1]] = t[2] === '0' ? 0 : t[2] === '1' ? 1 : 'X';
    }
    vectors.push(vec);
    if (vectors.length > MAX_STEPS) throw InputError.at('stimulus.too-long', `more than ${MAX_STEPS} steps`, { file, line: i + 1, col: 1 });
  });
  if (vectors.length === 0) throw InputError.at('stimulus.empty', 'no steps given', { file, line: 1, col: 1 });
  return clock ? { kind: 'clocked', clock, vectors } : { kind: 'vectors', vectors };
}
