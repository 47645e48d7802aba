// double-inversion: an inverter whose output only feeds a second inverter gives back its own
// input — both go and the second one's loads move onto the original signal (fan-out and, for a
// resistor-pulled RTL line, its loaded high level checked). When the middle net has other loads,
// only the second inverter goes. A NOR or NAND whose other inputs are tied to the rails is such an
// inverter: it is named by the transistor that reads the signal, and its tied-off parts go with it.
import { z } from 'zod';
import type { FlatNetlist } from '../netlist/ir';
import type { LogicNode, SwitchNetwork } from '../extract/types';
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

/** The switches of a network with the condition each conducts under. */
function switchesOf(n: SwitchNetwork | undefined, into: { device: number; constant: boolean }[] = []): { device: number; constant: boolean }[] {
  if (!n) return into;
  if (n.type === 'switch') into.push({ device: n.device, constant: n.on.op === 'const' });
  else for (const p of n.parts) switchesOf(p, into);
  return into;
}

/**
 * An inverter's gate: the transistor that reads the signal (the first of the group's devices that
 * conducts on some input) and the transistors whose inputs are tied to a rail, each with that rail
 * — a NOR or NAND with its other inputs tied off computes the inverse of the one left.
 */
export function inverterParts(nl: Readonly<FlatNetlist>, rails: ReadonlySet<number>, node: LogicNode): { reads: number; tied: { device: number; rail?: string }[] } {
  const g = node.groups[0];
  const sw = [...switchesOf(g.pullDown), ...switchesOf(g.pullUp)];
  const live = new Set(sw.filter((x) => !x.constant).map((x) => x.device));
  const reads = g.devices.find((d) => live.has(d)) ?? g.devices[0];
  const tied = sw
    .filter((x) => x.constant)
    .map(({ device }) => {
      // the rail the transistor's control sits on: its gate, or a terminal of its base network
      const dev = nl.devices[device];
      const base = g.bases.find((b) => b.transistor === device);
      const nets = dev.kind === 'nmos' || dev.kind === 'pmos' ? [dev.terminals[1]] : (base?.devices ?? []).flatMap((d) => nl.devices[d].terminals);
      const rail = nets.find((t) => rails.has(t));
      return rail === undefined ? { device } : { device, rail: nl.nets[rail].name };
    });
  return { reads, tied };
}

export const doubleInversion = defineRule({
  id: 'double-inversion',
  meta: {
    description: 'An inverter feeding only another inverter: remove both and drive the second one’s loads from the original signal.',
    messages: {
      pair: '{first} inverts {input} and {second} inverts it back ({place}); {middle} feeds nothing else, so both can go and the {loads} load(s) of {output} move to {input}',
      secondOnly:
        '{second} inverts {middle}, itself the inverse of {input} ({place}); {middle} has other loads, so only {second} can go and its {loads} load(s) move to {input}',
      pairTied:
        '{first} inverts {input} and {second} inverts it back ({place}); the other inputs of their gates are tied to rails ({tied}), so those transistors never switch; {middle} feeds nothing else, so both gates can go with the {tiedParts} part(s) on the tied inputs and the {loads} load(s) of {output} move to {input}',
      secondOnlyTied:
        '{second} inverts {middle}, itself the inverse of {input} ({place}); the other inputs of its gate are tied to rails ({tied}), so those transistors never switch; {middle} has other loads, so only the gate of {second} can go, with the {tiedParts} part(s) on the tied inputs, and its {loads} load(s) move to {input}',
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
      const first_ = inverterParts(nl, idx.railNets, first);
      const second_ = inverterParts(nl, idx.railNets, second);
      // Tied-off transistors of the gates that go, each with its base network: they go too.
      const goes = onlySecond ? ([[first, first_.tied], [second, second_.tied]] as const) : ([[second, second_.tied]] as const);
      const tied = goes.flatMap(([, t]) => t);
      const tiedParts = new Set<number>();
      for (const [node, t] of goes) {
        for (const { device } of t) {
          tiedParts.add(device);
          for (const d of node.groups[0].bases.find((b) => b.transistor === device)?.devices ?? []) tiedParts.add(d);
        }
      }
      const path = second.groups[0].path;
      const outLoads = lineLoads(idx, outNet, ctx.margins, gone).length;
      const data: Record<string, string | number> = {
        first: nl.devices[first_.reads].name,
        second: nl.devices[second_.reads].name,
        input,
        middle: first.name,
        output: second.name,
        loads: outLoads,
        place: placeOf(path),
      };
      if (tied.length) {
        data.tied = tied.map((t) => (t.rail ? `${nl.devices[t.device].name} on ${t.rail}` : nl.devices[t.device].name)).join(', ');
        data.tiedParts = tiedParts.size;
      }
      ctx.report({
        messageId: onlySecond ? (tied.length ? 'pairTied' : 'pair') : tied.length ? 'secondOnlyTied' : 'secondOnly',
        data,
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
