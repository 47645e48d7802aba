// shared-enable-switch: N pull-down stacks that each put their own transistor, driven by the same
// enable, in series below a per-bit data transistor become stacks meeting on one shared switch —
// checked for the switch's sink current and forced β, the stacked low level, and sneak paths
// between outputs through the common node (switch-level simulation before and after).
import { z } from 'zod';
import type { LogicNode, SwitchNetwork } from '../extract/types';
import { exprToString } from '../logic/expr';
import { forcedBeta, sinkCurrent, stackedLowLevel } from '../margins/bipolar';
import { maxOf, type MarginResult } from '../margins/corners';
import type { FlatNetlist } from '../netlist/ir';
import { defineRule } from './define-rule';
import { chunked, fewestParts, worstPerName, type Chunk } from './support/chunks';
import { betaMinOfDevice } from './support/driver-margins';
import { describePlaces } from './support/finding-words';
import { NetIndex } from './support/net-index';
import { RegionSims } from './support/region-sim';
import { sneakMargin } from './support/sneak-check';
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
  // The shared per-design index: device owners and the terminals on each net (to see that a
  // stack's internal net is its own), built once for every rule of a scan.
  const index = NetIndex.of(nl, view);
  const owners = index.ownerCount;
  const lowRails = new Set(nl.rails.filter((r) => r.volts <= 0).map((r) => r.net));
  const onlyOwn = (net: number, own: Set<number>): boolean => {
    const { from, to } = index.termRange(net);
    for (let at = from; at < to; at++) if (!own.has(index.termDevice(at))) return false;
    return true;
  };
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
      if (!onlyOwn(end.internal, own)) continue;
      const ohms = base?.baseResistors.map((r) => r.ohms).filter((x): x is number => x !== undefined);
      out.push({
        node: ni,
        switchDevice: last.device,
        devices,
        internal: end.internal,
        enable: `${node.family}|${exprToString(last.on)}`,
        depth: br.parts.length,
        ...(ohms && ohms.length ? { baseOhms: maxOf(ohms) } : {}),
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
  const low = stackedLowLevel({ vcc, stack: maxOf([chunk.keep, ...chunk.others].map((i) => stacks[i].depth)), receiver: node.family }, ctx.margins);
  // The stacks keep their depth: a worst-case low level the design already has is flagged, but it
  // is not this rewrite's failing.
  out.push(low.status === 'fail' ? { ...low, status: 'warn', note: `${low.note}; the stacks are this deep before the rewrite too` } : low);
  return out;
}

/**
 * Margins of a split of the stacks, computed once per distinct part: a part's margins depend only
 * on what switchMargins reads of its stacks, in order (their signatures), so identical bytes or
 * slices cost one computation per part size. `monotone` when every stack is alike: the largest
 * part is then the worst and shrinks as the count grows, and each check only worsens with more
 * identical stacks on one switch (the sink current adds up, forced β rises with it, the stack
 * depth stays), so once a count passes every larger count does.
 */
function partMargins(ctx: RuleContext, stacks: EnableStack[], members: number[]): { marginsFor: (chunks: Chunk[]) => MarginResult[]; monotone: boolean } {
  const nl = ctx.netlist;
  const sigIds = new Map<string, number>();
  const sigOf = new Map<number, number>();
  for (const i of members) {
    const st = stacks[i];
    const node = ctx.view.nodes[st.node];
    const sig = `${nl.devices[st.switchDevice].kind}|${node.family}|${node.pullUp?.ohms}|${node.pullUp?.railVolts}|${st.baseOhms}|${betaMinOfDevice(nl, st.switchDevice, ctx.margins)}|${st.depth}`;
    if (!sigIds.has(sig)) sigIds.set(sig, sigIds.size);
    sigOf.set(i, sigIds.get(sig)!);
  }
  const memo = new Map<string, MarginResult[]>();
  const chunkMargins = (ch: Chunk): MarginResult[] => {
    let key = '';
    let last = -1;
    let count = 0;
    for (const i of [ch.keep, ...ch.others]) {
      const id = sigOf.get(i)!;
      if (id !== last && count > 0) {
        key += `${last}x${count},`;
        count = 0;
      }
      last = id;
      count++;
    }
    key += `${last}x${count}`;
    let ms = memo.get(key);
    if (!ms) memo.set(key, (ms = switchMargins(ctx, stacks, ch)));
    return ms;
  };
  return { marginsFor: (chunks) => worstPerName(chunks.flatMap(chunkMargins)), monotone: sigIds.size === 1 };
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
    stacks.forEach((s, i) => {
      const list = byEnable.get(s.enable);
      if (list) list.push(i);
      else byEnable.set(s.enable, [i]);
    });
    const nl = ctx.netlist;
    // Regions of the same structure (every byte of a bus, every slice of a register) are
    // simulated once: the runs are keyed on the region's canonical form, not on its names.
    const sims = new RegionSims(nl, options.sneakExhaustiveLimit);
    for (const [enable, members] of byEnable) {
      if (members.length < options.minCopies) continue;
      const nodes = members.map((i) => ctx.view.nodes[stacks[i].node]);
      const { marginsFor, monotone } = partMargins(ctx, stacks, members);
      let { parts, margins, passes } = fewestParts(members, marginsFor, { monotone });
      let chunks = chunked(members, parts);
      let edit = shareEdit(ctx, stacks, chunks);
      const region = nodes.flatMap((n) => n.devices);
      const inputs = [...new Set(nodes.flatMap((n) => n.inputs))].sort();
      const outputs = nodes.map((n) => n.name);
      const sneakOf = (e: Edit) => sneakMargin(sims.region(region, e, inputs, outputs).sneak());
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
