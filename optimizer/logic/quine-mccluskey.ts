// Exact two-level minimisation of small single-output functions with don't-cares.
// Prime implicants by the tabular method of W. V. Quine, "The problem of simplifying truth
// functions", Amer. Math. Monthly 59(8), 1952, and E. J. McCluskey, "Minimization of Boolean
// functions", Bell Syst. Tech. J. 35(6), 1956; the cover is chosen exactly by branch and bound
// (essential primes, row and column dominance, an independent-set lower bound), minimising the
// number of terms first and literals second.
import { InputError } from '../errors';
import { type Cover, type Cube, literalCount, cubeContains, type MultiCover } from './cubes';
import { constantValue, mintermsOf, type OutputTable, type TruthTable } from './truth-table';

/** Beyond this the prime table and the covering search grow too fast for an exact answer. */
export const MAX_QM_INPUTS = 12;

/** Search nodes allowed before the best cover found so far is returned as not proved minimal. */
const NODE_BUDGET = 2_000_000;

export interface QmResult {
  cover: Cover;
  /** True when the cover is proved minimal (terms, then literals). */
  exact: boolean;
}

/** All prime implicants of the function whose on-set ∪ dc-set is `ones`. */
export function primeImplicants(ones: number[], n: number): Cube[] {
  const primes: Cube[] = [];
  let level = new Map<number, Set<number>>();
  if (ones.length === 0) return primes;
  level.set(2 ** n - 1, new Set(ones));
  while (level.size > 0) {
    const next = new Map<number, Set<number>>();
    for (const [care, values] of level) {
      const merged = new Set<number>();
      for (const v of values) {
        for (let rest = care; rest !== 0; rest &= rest - 1) {
          const bit = rest & -rest;
          if (v & bit) continue;
          if (values.has(v | bit)) {
            merged.add(v).add(v | bit);
            const nc = care & ~bit;
            let group = next.get(nc);
            if (!group) next.set(nc, (group = new Set()));
            group.add(v);
          }
        }
      }
      for (const v of values) if (!merged.has(v)) primes.push({ care: care >>> 0, value: v });
    }
    level = next;
  }
  return primes;
}

/** Exact (or, past the node budget, best-found) minimum cover of one output. */
export function minimiseOutputQm(out: OutputTable, n: number): QmResult {
  if (n > MAX_QM_INPUTS) {
    throw InputError.at('logic.qm-too-large', `exact minimisation is limited to ${MAX_QM_INPUTS} inputs, got ${n}`);
  }
  const constant = constantValue(out, n);
  if (constant === 0) return { cover: [], exact: true };
  if (constant === 1) return { cover: [{ care: 0, value: 0 }], exact: true };
  const on = mintermsOf(out.on, n);
  const dc = mintermsOf(out.dc, n);
  const primes = primeImplicants([...on, ...dc].sort((a, b) => a - b), n);
  return chooseCover(primes, on);
}

export function minimiseQm(table: TruthTable): { cover: MultiCover; exact: boolean } {
  const n = table.inputs.length;
  let exact = true;
  const outputs = table.outputs.map((o) => {
    const r = minimiseOutputQm(o, n);
    exact &&= r.exact;
    return { name: o.name, cover: r.cover };
  });
  return { cover: { inputs: [...table.inputs], outputs }, exact };
}

/** Unate covering: pick primes so every on-set minterm is covered, fewest terms then literals. */
function chooseCover(primes: Cube[], on: number[]): QmResult {
  const lits = primes.map(literalCount);
  // coveredBy[j] = primes covering minterm j; covers[p] = minterm indices prime p covers.
  const coveredBy: number[][] = on.map(() => []);
  const covers: number[][] = primes.map(() => []);
  primes.forEach((p, pi) =>
    on.forEach((m, j) => {
      if (cubeContains(p, m)) {
        coveredBy[j].push(pi);
        covers[pi].push(j);
      }
    }),
  );

  const chosen: number[] = [];
  const covered = new Uint8Array(on.length);
  const alive = new Uint8Array(primes.length).fill(1);
  const choose = (p: number) => {
    chosen.push(p);
    alive[p] = 0;
    for (const j of covers[p]) covered[j] = 1;
  };

  // Reduce: essentials, dominated primes (rows), dominating minterms (columns), to a fixed point.
  const colAlive = new Uint8Array(on.length).fill(1);
  for (let changed = true; changed; ) {
    changed = false;
    for (let j = 0; j < on.length; j++) {
      if (covered[j] || !colAlive[j]) continue;
      const live = coveredBy[j].filter((p) => alive[p]);
      if (live.length === 1) {
        choose(live[0]);
        changed = true;
      }
    }
    const openOf = (p: number) => covers[p].filter((j) => !covered[j] && colAlive[j]);
    const open = primes.map((_, p) => (alive[p] ? openOf(p) : []));
    for (let p = 0; p < primes.length; p++) {
      if (!alive[p]) continue;
      if (open[p].length === 0) {
        alive[p] = 0;
        changed = true;
        continue;
      }
      for (let q = 0; q < primes.length; q++) {
        if (q === p || !alive[q] || lits[q] > lits[p]) continue;
        if (open[q].length < open[p].length) continue;
        if (open[q].length === open[p].length && lits[q] === lits[p] && q > p) continue;
        const sq = new Set(open[q]);
        if (open[p].every((j) => sq.has(j))) {
          alive[p] = 0;
          changed = true;
          break;
        }
      }
    }
    const cols = on.map((_, j) => j).filter((j) => !covered[j] && colAlive[j]);
    const rowsOf = cols.map((j) => new Set(coveredBy[j].filter((p) => alive[p])));
    for (let a = 0; a < cols.length; a++) {
      for (let b = 0; b < cols.length; b++) {
        if (a === b || !colAlive[cols[a]] || !colAlive[cols[b]]) continue;
        // Column b dominates column a when every prime covering a also covers b: drop b.
        if (rowsOf[a].size > rowsOf[b].size) continue;
        if (rowsOf[a].size === rowsOf[b].size && a > b) continue;
        let sub = true;
        for (const p of rowsOf[a]) if (!rowsOf[b].has(p)) sub = false;
        if (sub) {
          colAlive[cols[b]] = 0;
          changed = true;
        }
      }
    }
  }

  const rest = on.map((_, j) => j).filter((j) => !covered[j] && colAlive[j]);
  const base = chosen.slice();
  const baseLits = base.reduce((s, p) => s + lits[p], 0);
  if (rest.length === 0) return { cover: base.map((p) => primes[p]), exact: true };

  const cand = rest.map((j) => coveredBy[j].filter((p) => alive[p]));
  let best: number[] | undefined;
  let bestTerms = Infinity;
  let bestLits = Infinity;
  let nodes = 0;
  const count = new Int32Array(rest.length); // how many chosen primes cover rest[k]
  const restIndex = new Map(rest.map((j, k) => [j, k]));
  const coversRest = primes.map((_, p) => covers[p].map((j) => restIndex.get(j)).filter((k): k is number => k !== undefined));
  const pick: number[] = [];

  const lowerBound = (): number => {
    // Uncovered minterms no two of which share a candidate prime each need their own term.
    const used = new Set<number>();
    let lb = 0;
    for (let k = 0; k < rest.length; k++) {
      if (count[k] > 0) continue;
      if (cand[k].some((p) => used.has(p))) continue;
      lb++;
      for (const p of cand[k]) used.add(p);
    }
    return lb;
  };

  const search = (litsSoFar: number): void => {
    if (++nodes > NODE_BUDGET) return;
    let target = -1;
    for (let k = 0; k < rest.length; k++) {
      if (count[k] === 0 && (target < 0 || cand[k].length < cand[target].length)) target = k;
    }
    if (target < 0) {
      if (pick.length < bestTerms || (pick.length === bestTerms && litsSoFar < bestLits)) {
        best = pick.slice();
        bestTerms = pick.length;
        bestLits = litsSoFar;
      }
      return;
    }
    const lb = pick.length + lowerBound();
    if (lb > bestTerms || (lb === bestTerms && litsSoFar >= bestLits)) return;
    const options = cand[target].slice().sort((a, b) => coversRest[b].length - coversRest[a].length || lits[a] - lits[b]);
    for (const p of options) {
      pick.push(p);
      for (const k of coversRest[p]) count[k]++;
      search(litsSoFar + lits[p]);
      for (const k of coversRest[p]) count[k]--;
      pick.pop();
    }
  };
  search(baseLits);
  if (best === undefined) best = greedy(rest.length, cand, coversRest);
  return { cover: [...base, ...best].map((p) => primes[p]), exact: nodes <= NODE_BUDGET };
}

/** Greedy completion (most uncovered minterms first) for when the search budget ran out early. */
function greedy(size: number, cand: number[][], coversRest: number[][]): number[] {
  const done = new Uint8Array(size);
  const out: number[] = [];
  for (let k = 0; k < size; k++) {
    if (done[k]) continue;
    let bestP = cand[k][0];
    let bestGain = -1;
    for (const p of cand[k]) {
      const gain = coversRest[p].filter((x) => !done[x]).length;
      if (gain > bestGain) [bestP, bestGain] = [p, gain];
    }
    out.push(bestP);
    for (const x of coversRest[bestP]) done[x] = 1;
  }
  return out;
}
