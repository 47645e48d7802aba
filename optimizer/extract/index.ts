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

function* chain<T>(...lists: T[][]): Generator<T> {
  for (const l of lists) yield* l;
}

export function extractLogic(nl: FlatNetlist): LogicView {
  const cx = makeContext(nl);
  const nNets = nl.nets.length;
  // Nets something reads as a control: MOS gates, bipolar bases, gate-level inputs.
  const controlRead = new Uint8Array(nNets);
  for (const d of nl.devices) {
    if (d.kind === 'nmos' || d.kind === 'pmos' || d.kind === 'npn' || d.kind === 'pnp') controlRead[d.terminals[1]] = 1;
    else if (d.kind === 'gate' && d.op !== 'pullup' && d.op !== 'pulldown') for (let t = 1; t < d.terminals.length; t++) controlRead[d.terminals[t]] = 1;
  }
  const bases = new BaseResolver(cx);
  const bip = extractBipolar(cx, bases);
  for (const nd of bip) for (const g of nd.groups) for (const b of g.bases) for (const i of b.inputs) controlRead[i] = 1;
  const gates = extractGates(cx);
  const driven = new Set<number>();
  for (const n of bip) driven.add(n.net);
  for (const n of gates) driven.add(n.net);
  const mos = extractMos(cx, driven, (n) => controlRead[n] === 1);

  // One node per net: the first extractor to claim a net wins; a clash is reported.
  const nodes: LogicNode[] = [];
  const claimed = new Uint8Array(nNets);
  for (const node of chain(gates, bip, mos)) {
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
  const summary = summariseNodes(nl, nodes);
  cx.diagnostics.push(...summary.loops);

  // Transistors no group explains are reported, never dropped silently.
  const used = new Uint8Array(nl.devices.length);
  for (const n of nodes) for (const d of n.devices) used[d] = 1;
  const unexplained: string[] = [];
  for (let i = 0; i < nl.devices.length; i++) {
    const d = nl.devices[i];
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
