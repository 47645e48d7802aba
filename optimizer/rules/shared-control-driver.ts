// shared-control-driver: N gates computing the same function of the same control nets (one enable
// or strobe inverter per bit slice) become the fewest shared drivers whose fan-out, loaded high
// level and load base currents still pass; when none do, the one-driver rewrite is shown failing.
import { z } from 'zod';
import type { LogicNode, LogicView } from '../extract/types';
import type { MarginSettings } from '../margins/defaults';
import type { MarginResult } from '../margins/corners';
import type { FlatNetlist } from '../netlist/ir';
import { exprToString, type Expr } from '../logic/expr';
import { checkEquivalence } from '../verify/equivalence';
import { defineRule } from './define-rule';
import { driverSignature, sharedDriverMargins } from './support/driver-margins';
import { sameFunctionClasses } from './support/same-function';
import { NetIndex, mergeDriverLoads, type DriverLoads } from './support/net-index';
import { describePlaces } from './support/finding-words';
import { chunked, fewestParts, worstPerName, type Chunk, type PartsSearch } from './support/chunks';
import { emptyEdit, type Edit } from './types';

const OptionsSchema = z.object({
  /** Largest input count of the gates compared. */
  maxInputs: z.number().int().min(1).max(12),
  /** Fewest copies worth a finding. */
  minCopies: z.number().int().min(2),
});

export const sharedControlDriver = defineRule({
  id: 'shared-control-driver',
  meta: {
    description:
      'Finds gates that compute the same function of the same control nets (typically one enable or strobe inverter per bit slice) and proposes the fewest shared drivers that keep fan-out, loaded high level and load base currents.',
    messages: {
      share: '{count} copies of {function} on {inputs} ({where}) can be one shared driver for all {loads} loads',
      split: '{count} copies of {function} on {inputs} ({where}) can be {drivers} shared drivers; one driver for all {loads} loads fails {failed}',
      failing: '{count} copies of {function} on {inputs} ({where}) compute the same thing, but a shared driver fails {failed}; keeping them separate is what keeps the margins',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { maxInputs: 6, minCopies: 2 },
  },
  find(ctx, options) {
    const { netlist: nl, view } = ctx;
    const index = NetIndex.of(nl, view);
    const owners = index.ownerCount;
    const classes = sameFunctionClasses(view, {
      maxInputs: options.maxInputs,
      minSize: options.minCopies,
      // Every device of a copy must be its own, or removing the copy would break another net.
      accept: (node) => node.groups.length === 1 && node.devices.every((d) => owners[d] === 1),
    });
    if (classes.length === 0) return;
    for (const cls of classes) {
      const nodes = cls.members.map((i) => view.nodes[i]);
      const loads = new Map<number, DriverLoads>(cls.members.map((i) => [i, index.driverLoads(view.nodes[i].net)]));
      // Each distinct way the copies compute it is proved equal to the kept one's (once per
      // distinct expression, not once per copy: thousands of slices usually write it one way).
      const before: Record<string, Expr> = {};
      const after: Record<string, Expr> = {};
      const seen = new Set<string>();
      for (const n of nodes) {
        const text = exprToString(n.fn);
        if (seen.has(text)) continue;
        seen.add(text);
        before[n.name] = n.fn;
        after[n.name] = nodes[0].fn;
      }
      if (checkEquivalence(before, after).verdict !== 'proved') continue;

      const { marginsFor, atLeast, monotone } = partMargins(nl, view, cls.members, loads, ctx.margins);
      const { parts: drivers, margins, single, passes } = fewestParts(cls.members, marginsFor, { atLeast, monotone });
      const chunks = chunked(cls.members, drivers);
      const totalLoads = [...loads.values()].reduce((s, l) => s + l.total, 0);
      const failed = single.filter((m) => m.status === 'fail').map((m) => m.name).join(', ');
      const data = {
        count: nodes.length,
        function: exprToString(cls.fn),
        inputs: cls.inputs.join(', '),
        where: describePlaces(nodes),
        loads: totalLoads,
        drivers,
        ...(failed ? { failed } : {}),
      };
      ctx.report({
        messageId: !passes ? 'failing' : drivers === 1 ? 'share' : 'split',
        data,
        location: {
          devices: nodes.flatMap((n) => n.devices.map((d) => nl.devices[d].name)),
          instances: [...new Set(nodes.map((n) => n.groups[0].path.join('.')).filter(Boolean))],
          nets: nodes.map((n) => n.name),
        },
        proposals: [
          {
            title:
              drivers === 1
                ? `Drive all ${nodes.length} loads of ${data.function} from ${nodes[0].name}`
                : `Share ${drivers} drivers of ${data.function} among ${nodes.length} copies`,
            edit: shareEdit(nl.devices, chunks.map((ch) => ({ keep: view.nodes[ch.keep], others: ch.others.map((i) => view.nodes[i]) }))),
            assumptions: [],
            margins,
          },
        ],
      });
    }
  },
});

/**
 * Margins of the shared drivers for a split of the members, and what the search may assume.
 * Each member's driver and loads are reduced once to a signature; a driver's margins depend only
 * on the signatures of its members in order, so they are computed once per distinct part (with
 * identical slices, once per part size) rather than once per part per count tried.
 */
function partMargins(
  nl: FlatNetlist,
  view: LogicView,
  members: number[],
  loads: Map<number, DriverLoads>,
  s: MarginSettings,
): { marginsFor: (chunks: Chunk[]) => MarginResult[] } & Required<Pick<PartsSearch, 'atLeast' | 'monotone'>> {
  const betaMemo = new Map<string | undefined, number>();
  const sigIds = new Map<string, number>();
  const sigOf = new Map<number, number>();
  let total = 0;
  let fanOutLimit = 0;
  for (const i of members) {
    const sig = driverSignature(nl, view.nodes[i], loads.get(i)!, s, betaMemo);
    if (!sigIds.has(sig)) sigIds.set(sig, sigIds.size);
    sigOf.set(i, sigIds.get(sig)!);
    total += loads.get(i)!.total;
    fanOutLimit = Math.max(fanOutLimit, s.fanOut[view.nodes[i].family]);
  }
  const memo = new Map<string, MarginResult[]>();
  const chunkMargins = (ch: Chunk): MarginResult[] => {
    // Run-length text of the members' signatures: the part's whole content, in order.
    const runs: string[] = [];
    let last = -1;
    let count = 0;
    for (const i of [ch.keep, ...ch.others]) {
      const id = sigOf.get(i)!;
      if (id !== last && count > 0) {
        runs.push(`${last}x${count}`);
        count = 0;
      }
      last = id;
      count++;
    }
    runs.push(`${last}x${count}`);
    const key = runs.join(',');
    let ms = memo.get(key);
    if (!ms) {
      ms = sharedDriverMargins(nl, view.nodes[ch.keep], mergeDriverLoads([ch.keep, ...ch.others].map((i) => loads.get(i)!)), s);
      memo.set(key, ms);
    }
    return ms;
  };
  return {
    marginsFor: (chunks) => worstPerName(chunks.flatMap(chunkMargins)),
    // Pigeonhole: with k drivers one carries at least total / k loads, and fan-out fails above the
    // largest limit any member's family allows; so fewer than total / limit drivers all fail.
    atLeast: fanOutLimit > 0 ? Math.ceil(total / fanOutLimit) : total > 0 ? Infinity : 1,
    // Identical members: near-equal parts differ by one member at most, the largest part is the
    // worst, and it shrinks as the count grows. Every check here worsens as a driver takes more
    // identical loads (fan-out and sink current add up; the loaded high level falls as the bases
    // load the pull-up in parallel, so each base gets less current; the forced β of the driver
    // rises with the current it sinks), so once a count passes every larger count passes.
    monotone: sigIds.size === 1,
  };
}

/** Removes every copy but the kept one of each chunk and joins the copies' outputs to it. */
function shareEdit(devices: readonly { name: string }[], chunks: { keep: LogicNode; others: LogicNode[] }[]): Edit {
  const edit = emptyEdit();
  for (const ch of chunks) {
    for (const o of ch.others) {
      edit.removeDevices.push(...o.devices.map((d) => devices[d].name));
      edit.mergeNets.push({ keep: ch.keep.name, remove: o.name });
    }
  }
  return edit;
}
