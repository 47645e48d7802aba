// double-inversion: an inverter whose output only feeds a second inverter gives back its own
// input — both go and the second one's loads move onto the original signal (fan-out and, for a
// resistor-pulled RTL line, its loaded high level checked). When the middle net has other loads,
// only the second inverter goes.
import { z } from 'zod';
import type { LogicNode } from '../extract/types';
import type { MapFamily } from '../logic/family-parts';
import { support } from '../logic/expr';
import { defineRule } from './define-rule';
import { instancesOf, placeOf } from './support/finding-words';
import { lineLoads, lineMargins } from './support/driver-margins';
import { NetIndex } from './support/net-index';
import { emptyEdit } from './types';

/** The net a node inverts, when it is a plain single-driver inverter. */
export function invertedInput(node: LogicNode): string | undefined {
  if (node.kind !== 'static' || node.enable || node.groups.length !== 1) return undefined;
  return node.fn.op === 'not' && node.fn.arg.op === 'var' ? node.fn.arg.name : undefined;
}

export const doubleInversion = defineRule({
  id: 'double-inversion',
  meta: {
    description: 'An inverter feeding only another inverter: remove both and drive the second one’s loads from the original signal.',
    messages: {
      pair: '{first} inverts {input} and {second} inverts it back ({place}); {middle} feeds nothing else, so both can go and the {loads} load(s) of {output} move to {input}',
      secondOnly:
        '{second} inverts {middle}, itself the inverse of {input} ({place}); {middle} has other loads, so only {second} can go and its {loads} load(s) move to {input}',
    },
    optionsSchema: z.object({
      /** Also propose removing just the second inverter when the middle net has other loads. */
      secondOnly: z.boolean(),
    }),
    defaultOptions: { secondOnly: true },
  },
  find(ctx, options) {
    const { netlist: nl, view } = ctx;
    const idx = new NetIndex(nl, view);
    const named = new Set<string>();
    for (const a of ctx.assumptions) support(a.expr, named);
    const nodeByName = new Map(view.nodes.map((n, i) => [n.name, i]));
    const state = new Set(view.stateBits);
    view.nodes.forEach((second) => {
      const middleName = invertedInput(second);
      if (!middleName || state.has(second.name) || named.has(second.name)) return;
      const mi = nodeByName.get(middleName);
      if (mi === undefined) return;
      const first = view.nodes[mi];
      const input = invertedInput(first);
      if (!input || input === second.name || state.has(first.name) || !idx.ownsAlone(first) || !idx.ownsAlone(second)) return;
      const inputNet = idx.netId(input);
      const outNet = second.net;
      if (inputNet === undefined || idx.railNets.has(inputNet) || idx.railNets.has(outNet)) return;
      const readers = idx.readers(first.net);
      const onlySecond = !readers.external && readers.nodes.size === 1 && !named.has(first.name);
      if (!onlySecond && !options.secondOnly) return;
      const removed = onlySecond ? [...first.devices, ...second.devices] : [...second.devices];
      const gone = new Set(removed);
      const driver = idx.nodeOfNet(inputNet);
      const loads = [...lineLoads(idx, inputNet, ctx.margins, gone), ...lineLoads(idx, outNet, ctx.margins, gone)];
      const family = (driver ?? second).family as MapFamily;
      const margins = lineMargins(driver, loads, family, ctx.margins);
      const name = (n: LogicNode) => nl.devices[n.groups[0].devices[0]].name;
      const path = second.groups[0].path;
      const outLoads = lineLoads(idx, outNet, ctx.margins, gone).length;
      ctx.report({
        messageId: onlySecond ? 'pair' : 'secondOnly',
        data: { first: name(first), second: name(second), input, middle: first.name, output: second.name, loads: outLoads, place: placeOf(path) },
        location: {
          devices: removed.map((d) => nl.devices[d].name),
          instances: instancesOf(removed.map((d) => nl.devices[d].path)),
          nets: [input, first.name, second.name],
        },
        proposals: [
          {
            title: onlySecond
              ? `remove the inverters driving ${first.name} and ${second.name}; ${second.name}'s loads take ${input}`
              : `remove the inverter driving ${second.name}; its loads take ${input}`,
            edit: { ...emptyEdit(), removeDevices: removed.map((d) => nl.devices[d].name), mergeNets: [{ keep: input, remove: second.name }] },
            margins,
          },
        ],
      });
    });
  },
});
