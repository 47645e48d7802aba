// merge-duplicate-logic: driven nets that compute the same function of the same nets (duplicated
// decode or gating logic) — keep one driver and move the others' loads to it, or the fewest
// drivers whose fan-out and (RTL) loaded high level still pass when one cannot carry them all.
import { z } from 'zod';
import { exprToString, support } from '../logic/expr';
import type { MapFamily } from '../logic/family-parts';
import type { MarginResult } from '../margins/corners';
import { defineRule } from './define-rule';
import { instancesOf, listWords, placeOf } from './support/finding-words';
import { failing, lineLoads, lineMargins, type LineLoad } from './support/driver-margins';
import { NetIndex } from './support/net-index';
import { sameFunctionClasses } from './support/same-function';
import { emptyEdit, type Edit } from './types';

export const mergeDuplicateLogic = defineRule({
  id: 'merge-duplicate-logic',
  meta: {
    description: 'Gates computing the same function of the same nets: keep one driver (or the fewest that keep margins) and move the loads of the others to it.',
    messages: {
      merge: '{count} gates compute {fn} of {inputs} ({places}); {kept} can drive all {loads} loads and the other {removed} can go',
      split: '{count} gates compute {fn} of {inputs} ({places}); one cannot carry all {loads} loads, so keep {drivers} of them ({kept}) and remove {removed}',
      failing: '{count} gates compute {fn} of {inputs} ({places}); merging them fails the margins of every smaller set of drivers',
    },
    optionsSchema: z.object({
      /** Largest input count compared by truth table. */
      maxInputs: z.number().int().min(1).max(16),
    }),
    defaultOptions: { maxInputs: 8 },
  },
  find(ctx, options) {
    const { netlist: nl, view } = ctx;
    const idx = new NetIndex(nl, view);
    const named = new Set<string>();
    for (const a of ctx.assumptions) support(a.expr, named);
    const state = new Set(view.stateBits);
    const classes = sameFunctionClasses(view, {
      maxInputs: options.maxInputs,
      kinds: ['static'],
      accept: (node) => idx.ownsAlone(node) && !state.has(node.name) && !named.has(node.name) && !idx.railNets.has(node.net),
    });
    for (const cls of classes) {
      const members = cls.members.map((i) => view.nodes[i]);
      const loads = members.map((m) => lineLoads(idx, m.net, ctx.margins));
      const total = loads.reduce((s, l) => s + l.length, 0);
      const family = cls.family as MapFamily;
      // Fewest drivers first: k = 1, 2, … bins packed largest-first onto the least-loaded bin.
      // Fewer than total / fan-out limit bins always leave one bin over the limit, so those k
      // are skipped (the first try, k = 1, is still kept for the refusal's margins).
      const order = loads.map((l, i) => i).sort((a, b) => loads[b].length - loads[a].length || a - b);
      const binMargins = (bin: number[], k: number) => {
        const kept = members[bin[0]];
        const all: LineLoad[] = bin.flatMap((m) => loads[m]);
        return lineMargins(kept, all, family, ctx.margins).map((r) => (k > 1 ? { ...r, note: `${kept.name}: ${r.note}` } : r));
      };
      const fanLimit = ctx.margins.fanOut[family];
      const firstUseful = Number.isFinite(fanLimit) && fanLimit > 0 ? Math.max(2, Math.ceil(total / fanLimit)) : 2;
      let chosen: { bins: number[][]; margins: MarginResult[] } | undefined;
      const firstBins = pack(order, loads, 1);
      const firstTry = { bins: firstBins, margins: firstBins.flatMap((bin) => binMargins(bin, 1)) };
      if (members.length > 1 && !failing(firstTry.margins)) chosen = firstTry;
      for (let k = firstUseful; k < members.length && !chosen; k++) {
        const bins = pack(order, loads, k);
        // Stop at the first bin that fails: a failing k is only tried, never shown.
        const margins: MarginResult[] = [];
        let ok = true;
        for (const bin of bins) {
          const m = binMargins(bin, k);
          margins.push(...m);
          if (failing(m)) {
            ok = false;
            break;
          }
        }
        if (ok) chosen = { bins, margins };
      }
      const plan = chosen ?? firstTry;
      const edit: Edit = emptyEdit();
      const keptNames: string[] = [];
      const removedNames: string[] = [];
      for (const bin of plan.bins) {
        const kept = members[bin[0]];
        keptNames.push(kept.name);
        for (const m of bin.slice(1)) {
          const gone = members[m];
          edit.removeDevices.push(...gone.devices.map((d) => nl.devices[d].name));
          edit.mergeNets.push({ keep: kept.name, remove: gone.name });
        }
      }
      const keptSet = new Set(keptNames);
      // a loop, not push(...list): a class can hold more members than a call has room for arguments
      for (const m of members) if (!keptSet.has(m.name)) removedNames.push(m.name);
      const places = listWords([...new Set(members.map((m) => placeOf(m.groups[0].path)))], 3);
      const messageId = !chosen ? 'failing' : plan.bins.length === 1 ? 'merge' : 'split';
      ctx.report({
        messageId,
        data: {
          count: members.length,
          fn: exprToString(cls.fn),
          inputs: listWords(cls.inputs),
          places,
          kept: listWords(keptNames),
          removed: listWords(removedNames),
          drivers: plan.bins.length,
          loads: total,
        },
        location: {
          devices: members.flatMap((m) => m.devices.map((d) => nl.devices[d].name)),
          instances: instancesOf(members.flatMap((m) => m.devices.map((d) => nl.devices[d].path))),
          nets: members.map((m) => m.name),
        },
        proposals: [
          {
            title: plan.bins.length === 1 ? `drive the loads of ${listWords(removedNames)} from ${keptNames[0]}` : `keep ${plan.bins.length} drivers (${listWords(keptNames)}) for ${total} loads`,
            edit,
            margins: plan.margins,
          },
        ],
      });
    }
  },
});

/**
 * Members (given heaviest first) split into k bins, each onto the lightest bin (the lowest-numbered
 * among equals, found with a heap); each bin lists members in design order.
 */
function pack(order: number[], loads: LineLoad[][], k: number): number[][] {
  const bins: number[][] = Array.from({ length: k }, () => []);
  const weight = new Array<number>(k).fill(0);
  // Min-heap of bin numbers by (weight, number); starts as 0 … k − 1, already a valid heap.
  const heap = Array.from({ length: k }, (_, i) => i);
  const less = (a: number, b: number) => weight[a] < weight[b] || (weight[a] === weight[b] && a < b);
  for (const m of order) {
    const best = heap[0];
    bins[best].push(m);
    weight[best] += Math.max(1, loads[m].length);
    // The root only grew: sift it down.
    let i = 0;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let s = i;
      if (l < k && less(heap[l], heap[s])) s = l;
      if (r < k && less(heap[r], heap[s])) s = r;
      if (s === i) break;
      [heap[i], heap[s]] = [heap[s], heap[i]];
      i = s;
    }
  }
  return bins.filter((b) => b.length > 0).map((b) => b.sort((x, y) => x - y));
}
