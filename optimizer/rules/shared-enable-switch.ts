// shared-enable-switch: N pull-down stacks that each put their own transistor, driven by the same
// enable, in series below a per-bit data transistor become stacks meeting on one shared switch —
// checked for the switch's sink current and forced β, the stacked low level, and sneak paths
// between outputs through the common node (switch-level simulation before and after).
import { z } from 'zod';
import type { LogicNode, SwitchNetwork } from '../extract/types';
import { exprToString } from '../logic/expr';
import { forcedBeta, sinkCurrent, stackedLowLevel } from '../margins/bipolar';
import type { MarginResult } from '../margins/corners';
import type { FlatNetlist } from '../netlist/ir';
import { defineRule } from './define-rule';
import { chunked, fewestParts, worstPerName, type Chunk } from './support/chunks';
import { betaMinOfDevice } from './support/driver-margins';
import { describePlaces } from './support/finding-words';
import { deviceOwnerCounts } from './support/same-function';
import { sneakCheck, sneakMargin } from './support/sneak-check';
import { emptyEdit, type Edit, type RuleContext } from './types';

const OptionsSchema = z.object({
  /** Fewest stacks worth a finding. */
  minCopies: z.number().int().min(2),
  /** Inputs simulated exhaustively by the sneak-path check; beyond, a seeded sample of 2^limit. */
  sneakExhaustiveLimit: z.number().int().min(1).max(14),
});

/** One stack's enable switch: the bottom switch of a series branch, its base network, its top net. */
export interface EnableStack {
  node: number;
  switchDevice: number;
  /** Devices removed with the switch (the transistor and its own base network). */
  devices: number[];
  /** Net between the data part of the stack and the switch. */
  internal: number;
  enable: string;
  /** Switches in series in the stack, the enable switch included. */
  depth: number;
  baseOhms?: number;
}

function lowEnd(nl: Readonly<FlatNetlist>, lowRails: Set<number>, dev: number): { internal: number } | undefined {
  const d = nl.devices[dev];
  if (d.kind === 'npn') return lowRails.has(d.terminals[2]) ? { internal: d.terminals[0] } : undefined;
  if (d.kind === 'nmos') {
    if (lowRails.has(d.terminals[2])) return { internal: d.terminals[0] };
    if (lowRails.has(d.terminals[0])) return { internal: d.terminals[2] };
  }
  return undefined;
}

export function enableStacks(ctx: RuleContext): EnableStack[] {
  const { netlist: nl, view } = ctx;
  const owners = deviceOwnerCounts(view, nl.devices.length);
  const lowRails = new Set(nl.rails.filter((r) => r.volts <= 0).map((r) => r.net));
  // Terminals per net, counted once, to see that a stack's internal net is its own.
  const users = new Map<number, Set<number>>();
  nl.devices.forEach((d, i) => d.terminals.forEach((t) => (users.get(t) ?? users.set(t, new Set()).get(t)!).add(i)));
  const out: EnableStack[] = [];
  view.nodes.forEach((node, ni) => {
    if (node.groups.length !== 1 || node.kind === 'tristate' || node.kind === 'latch' || node.kind === 'pass') return;
    const g = node.groups[0];
    if (!g.pullDown || g.pullUp) return;
    const branches: SwitchNetwork[] = g.pullDown.type === 'parallel' ? g.pullDown.parts : [g.pullDown];
    for (const br of branches) {
      if (br.type !== 'series' || br.parts.length < 2) continue;
      const last = br.parts[br.parts.length - 1];
      if (last.type !== 'switch') continue;
      const end = lowEnd(nl, lowRails, last.device);
      if (!end) continue;
      const base = g.bases.find((b) => b.transistor === last.device);
      const devices = [last.device, ...(base?.devices ?? [])];
      if (!devices.every((d) => owners[d] === 1)) continue;
      const own = new Set(node.devices);
      if (![...(users.get(end.internal) ?? [])].every((d) => own.has(d))) continue;
      const ohms = base?.baseResistors.map((r) => r.ohms).filter((x): x is number => x !== undefined);
      out.push({
        node: ni,
        switchDevice: last.device,
        devices,
        internal: end.internal,
        enable: `${node.family}|${exprToString(last.on)}`,
        depth: br.parts.length,
        ...(ohms && ohms.length ? { baseOhms: Math.max(...ohms) } : {}),
      });
      break;
    }
  });
  return out;
}

function switchMargins(ctx: RuleContext, stacks: EnableStack[], chunk: Chunk): MarginResult[] {
  const nl = ctx.netlist;
  const kept = stacks[chunk.keep];
  const nodes: LogicNode[] = [chunk.keep, ...chunk.others].map((i) => ctx.view.nodes[stacks[i].node]);
  const node = nodes[0];
  const out: MarginResult[] = [];
  if (nl.devices[kept.switchDevice].kind !== 'npn') return out;
  const pullUps = nodes.map((n) => n.pullUp?.ohms).filter((x): x is number => x !== undefined);
  const vcc = node.pullUp?.railVolts;
  if (vcc === undefined || pullUps.length === 0) return out;
  out.push(sinkCurrent({ vcc, pullUps }, ctx.margins));
  if (kept.baseOhms !== undefined) {
    out.push(forcedBeta({ vcc, pullUps, baseResistor: kept.baseOhms, betaMin: betaMinOfDevice(nl, kept.switchDevice, ctx.margins) }, ctx.margins));
  }
  const low = stackedLowLevel({ vcc, stack: Math.max(...[chunk.keep, ...chunk.others].map((i) => stacks[i].depth)), receiver: node.family }, ctx.margins);
  // The stacks keep their depth: a worst-case low level the design already has is flagged, but it
  // is not this rewrite's failing.
  out.push(low.status === 'fail' ? { ...low, status: 'warn', note: `${low.note}; the stacks are this deep before the rewrite too` } : low);
  return out;
}

function shareEdit(ctx: RuleContext, stacks: EnableStack[], chunks: Chunk[]): Edit {
  const nl = ctx.netlist;
  const edit = emptyEdit();
  for (const ch of chunks) {
    for (const o of ch.others) {
      edit.removeDevices.push(...stacks[o].devices.map((d) => nl.devices[d].name));
      edit.mergeNets.push({ keep: nl.nets[stacks[ch.keep].internal].name, remove: nl.nets[stacks[o].internal].name });
    }
  }
  return edit;
}

export const sharedEnableSwitch = defineRule({
  id: 'shared-enable-switch',
  meta: {
    description:
      'Finds pull-down stacks that each put their own transistor, driven by the same enable, in series with a per-bit data transistor, and proposes one shared switch in the common emitter/source path (the fewest that keep sink current and forced β), checked for sneak paths.',
    messages: {
      share: '{count} pull-down stacks switched by {enable} ({where}) can meet on {switches} shared enable switch(es)',
      failing: '{count} pull-down stacks switched by {enable} ({where}) could meet on one shared switch, but it fails {failed}',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { minCopies: 2, sneakExhaustiveLimit: 10 },
  },
  find(ctx, options) {
    const stacks = enableStacks(ctx);
    const byEnable = new Map<string, number[]>();
    stacks.forEach((s, i) => byEnable.set(s.enable, [...(byEnable.get(s.enable) ?? []), i]));
    const nl = ctx.netlist;
    for (const [enable, members] of byEnable) {
      if (members.length < options.minCopies) continue;
      const nodes = members.map((i) => ctx.view.nodes[stacks[i].node]);
      const marginsFor = (chunks: Chunk[]) => worstPerName(chunks.flatMap((ch) => switchMargins(ctx, stacks, ch)));
      let { parts, margins, passes } = fewestParts(members, marginsFor);
      let chunks = chunked(members, parts);
      let edit = shareEdit(ctx, stacks, chunks);
      const region = nodes.flatMap((n) => n.devices);
      const inputs = [...new Set(nodes.flatMap((n) => n.inputs))].sort();
      const sneakOf = (e: Edit) => sneakMargin(sneakCheck(nl, region, e, inputs, nodes.map((n) => n.name), options.sneakExhaustiveLimit));
      let sneak = sneakOf(edit);
      if (sneak.status === 'fail' && parts > 1) {
        // a split does not cure a sneak path: show the one-switch rewrite and why it is refused
        parts = 1;
        chunks = chunked(members, 1);
        edit = shareEdit(ctx, stacks, chunks);
        margins = marginsFor(chunks);
        sneak = sneakOf(edit);
      }
      margins = [...margins, sneak];
      passes = passes && sneak.status !== 'fail';
      const failed = margins.filter((m) => m.status === 'fail').map((m) => m.name).join(', ');
      const data = {
        count: members.length,
        enable: enable.slice(enable.indexOf('|') + 1),
        where: describePlaces(nodes),
        switches: parts,
        ...(failed ? { failed } : {}),
      };
      ctx.report({
        messageId: passes ? 'share' : 'failing',
        data,
        location: {
          devices: members.flatMap((i) => stacks[i].devices.map((d) => nl.devices[d].name)),
          instances: [...new Set(nodes.map((n) => n.groups[0].path.join('.')).filter(Boolean))],
          nets: nodes.map((n) => n.name),
        },
        proposals: [
          {
            title: parts === 1 ? `One enable switch on ${data.enable} for ${members.length} stacks` : `${parts} shared enable switches on ${data.enable}`,
            edit,
            assumptions: [],
            margins,
          },
        ],
      });
    }
  },
});
