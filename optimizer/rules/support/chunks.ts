// Splitting N copies into the fewest shared parts: near-equal runs in design order (each keeps its
// first member), and the worst margin per check over several shared parts.
import { worstOf, type MarginResult } from '../../margins/corners';

export interface Chunk {
  keep: number;
  others: number[];
}

/** Members split into k runs of near-equal size, in design order; each run keeps its first. */
export function chunked(members: number[], k: number): Chunk[] {
  const out: Chunk[] = [];
  const base = Math.floor(members.length / k);
  const extra = members.length % k;
  let at = 0;
  for (let i = 0; i < k; i++) {
    const size = base + (i < extra ? 1 : 0);
    const run = members.slice(at, at + size);
    at += size;
    out.push({ keep: run[0], others: run.slice(1) });
  }
  return out;
}

/** Worst result per margin name over several shared parts (order of first appearance). */
export function worstPerName(all: MarginResult[]): MarginResult[] {
  // One pass; a later result replaces the kept one only when strictly worse, as worstOf does.
  const worst = new Map<string, MarginResult>();
  for (const m of all) {
    const w = worst.get(m.name);
    if (!w || worstOf([w, m]) !== w) worst.set(m.name, m);
  }
  return [...worst.values()];
}

/** How fewestParts may search; see there. */
export interface PartsSearch {
  /** Checks whose failure does not depend on how the members are split (stop at once). */
  sizeFree?: (m: MarginResult) => boolean;
  /**
   * A count below which every split is known to fail (the caller proves it, e.g. by pigeonhole:
   * some part carries at least total / k loads). Counts below it are not tried.
   */
  atLeast?: number;
  /**
   * The caller proves that a split that passes keeps passing with more parts (e.g. identical
   * members, where the worst part is the largest and every check worsens with part size). The
   * count is then found by galloping and bisection instead of trying every count in turn.
   */
  monotone?: boolean;
}

/**
 * The fewest parts (1 … members − 1) whose margins all pass; when none does, one part with its
 * failing margins (`passes` false) so the attractive rewrite is shown refused, with the reason.
 * `sizeFree` names checks whose failure does not depend on how the members are split (such a
 * failure with one part refuses every split, so the search stops at once). The result is the same
 * as trying 1, 2, 3 … in turn: `atLeast` only skips counts proven to fail, and `monotone` only
 * bisects where passing is proven monotone in the count.
 */
export function fewestParts(
  members: number[],
  marginsFor: (chunks: Chunk[]) => MarginResult[],
  search: PartsSearch | ((m: MarginResult) => boolean) = {},
): { parts: number; margins: MarginResult[]; single: MarginResult[]; passes: boolean } {
  const { sizeFree = () => false, atLeast = 1, monotone = false } = typeof search === 'function' ? { sizeFree: search } : search;
  const single = marginsFor(chunked(members, 1));
  const fails = (ms: MarginResult[]) => ms.some((m) => m.status === 'fail');
  const refused = { parts: 1, margins: single, single, passes: false };
  if (single.some((m) => m.status === 'fail' && sizeFree(m))) return refused;
  if (!fails(single)) return { parts: 1, margins: single, single, passes: true };
  const lo = Math.max(2, Math.ceil(atLeast));
  const hi = members.length - 1;
  if (!(lo <= hi)) return refused;
  const tried = new Map<number, MarginResult[]>();
  const at = (k: number) => {
    let ms = tried.get(k);
    if (!ms) tried.set(k, (ms = marginsFor(chunked(members, k))));
    return ms;
  };
  if (!monotone) {
    for (let k = lo; k <= hi; k++) if (!fails(at(k))) return { parts: k, margins: at(k), single, passes: true };
    return refused;
  }
  // Gallop up from the lower bound (the answer is usually at or just above it), then bisect
  // between the last failing and the first passing count.
  let bad = lo - 1;
  let good = -1;
  for (let step = 1, k = lo; ; step *= 2) {
    if (!fails(at(k))) {
      good = k;
      break;
    }
    bad = k;
    if (k === hi) return refused;
    k = Math.min(hi, k + step);
  }
  while (good - bad > 1) {
    const mid = bad + Math.floor((good - bad) / 2);
    if (fails(at(mid))) bad = mid;
    else good = mid;
  }
  return { parts: good, margins: at(good), single, passes: true };
}
