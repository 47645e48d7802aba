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
  const names = [...new Set(all.map((m) => m.name))];
  return names.map((n) => worstOf(all.filter((m) => m.name === n))!);
}

/**
 * The fewest parts (1 … members − 1) whose margins all pass; when none does, one part with its
 * failing margins (`passes` false) so the attractive rewrite is shown refused, with the reason.
 * `sizeFree` names checks whose failure does not depend on how the members are split (such a
 * failure with one part refuses every split, so the search stops at once).
 */
export function fewestParts(
  members: number[],
  marginsFor: (chunks: Chunk[]) => MarginResult[],
  sizeFree: (m: MarginResult) => boolean = () => false,
): { parts: number; margins: MarginResult[]; single: MarginResult[]; passes: boolean } {
  const single = marginsFor(chunked(members, 1));
  const fails = (ms: MarginResult[]) => ms.some((m) => m.status === 'fail');
  if (single.some((m) => m.status === 'fail' && sizeFree(m))) return { parts: 1, margins: single, single, passes: false };
  let parts = 1;
  let margins = single;
  while (fails(margins) && parts + 1 < members.length) {
    parts++;
    margins = marginsFor(chunked(members, parts));
  }
  const passes = !fails(margins);
  return passes ? { parts, margins, single, passes } : { parts: 1, margins: single, single, passes };
}
