// Logic extraction: FlatNetlist → LogicView. Bipolar collector-node groups, MOS channel-connected
// components and gate-level primitives each give driven nets; then loops become latches, inputs
// and state bits are listed and families summed. Linear in the design apart from per-group work.
import type { FlatNetlist } from '../netlist/ir';
import { makeContext } from './context';
import { BaseResolver, extractBipolar } from './bipolar';
import { extractMos } from './mos';
import { extractGates } from './gates';
import { summariseNodes } from './summary';
import type { LogicNode, LogicView } from './types';

export type * from './types';

export function extractLogic(nl: FlatNetlist): LogicView {
  const cx = makeContext(nl);
  const nNets = nl.nets.length;
  // Nets something reads as a control: MOS gates, bipolar bases, gate-level inputs.
  const controlRead = new Uint8Array(nNets);
  // Indexed loops over the devices and nodes: a for-of loop (or a generator) makes an iterator
  // result per entry until the engine optimises the function, and these run once over millions.
  const devices = nl.devices;
  for (let k = 0; k < devices.length; k++) {
    const d = devices[k];
    if (d.kind === 'nmos' || d.kind === 'pmos' || d.kind === 'npn' || d.kind === 'pnp') controlRead[d.terminals[1]] = 1;
    else if (d.kind === 'gate' && d.op !== 'pullup' && d.op !== 'pulldown') for (let t = 1; t < d.terminals.length; t++) controlRead[d.terminals[t]] = 1;
  }
  const bases = new BaseResolver(cx);
  const bip = extractBipolar(cx, bases);
  for (let k = 0; k < bip.length; k++) {
    const groups = bip[k].groups;
    for (let g = 0; g < groups.length; g++) {
      const bs = groups[g].bases;
      for (let b = 0; b < bs.length; b++) for (const i of bs[b].inputs) controlRead[i] = 1;
    }
  }
  const gates = extractGates(cx);
  const driven = new Set<number>();
  for (let k = 0; k < bip.length; k++) driven.add(bip[k].net);
  for (let k = 0; k < gates.length; k++) driven.add(gates[k].net);
  const mos = extractMos(cx, driven, (n) => controlRead[n] === 1);

  // One node per net: the first extractor to claim a net wins; a clash is reported.
  const nodes: LogicNode[] = [];
  const claimed = new Uint8Array(nNets);
  for (const list of [gates, bip, mos]) {
    for (let k = 0; k < list.length; k++) {
      const node = list[k];
      if (claimed[node.net] === 1) {
        cx.diagnostics.push({
          severity: 'warning',
          code: 'extract.mixed-drivers',
          message: `net ${node.name} is driven by devices of different kinds; only the first driver is in the logic view`,
        });
        continue;
      }
      claimed[node.net] = 1;
      nodes.push(node);
    }
  }
  const summary = summariseNodes(nl, nodes);
  cx.diagnostics.push(...summary.loops);

  // Transistors no group explains are reported, never dropped silently.
  const used = new Uint8Array(devices.length);
  for (let k = 0; k < nodes.length; k++) {
    const ds = nodes[k].devices;
    for (let i = 0; i < ds.length; i++) used[ds[i]] = 1;
  }
  const unexplained: string[] = [];
  for (let i = 0; i < devices.length; i++) {
    const d = devices[i];
    if (!used[i] && (d.kind === 'npn' || d.kind === 'pnp' || d.kind === 'nmos' || d.kind === 'pmos')) unexplained.push(d.name);
  }
  if (unexplained.length) {
    cx.diagnostics.push({
      severity: 'warning',
      code: 'extract.unexplained',
      message: `${unexplained.length} transistor(s) not part of any recognised logic group: ${unexplained.slice(0, 8).join(', ')}${unexplained.length > 8 ? ', …' : ''}`,
    });
  }

  return { title: nl.title, nodes, ...summary.view, diagnostics: cx.diagnostics };
}
