// Diode steering onto an NMOS drain (the MOS analogue of the bipolar steering node): a common node
// that only steering diodes' cathodes and grounded NMOS channels touch pulls every line whose diode
// anode sits on it low while one of its NMOS conducts; the diodes block the other way. Also how a
// MOS line reads a pull-up from a pulled-up node (node-pull-ups.ts).
import { and, not, or, type Expr } from '../logic/expr';
import type { LogicNode, SwitchNetwork } from './types';
import { controlOf, isLowRail, isRail, otherEnd, type ExtractContext } from './context';
import { nodePullUp, withNodePullUp } from './node-pull-ups';
import { eachDiodeTap } from './diode-taps';

interface Steering {
  /** Per net: 0 not asked yet, 1 a steering node, 2 not. */
  is: Uint8Array;
  /** A steering node's pull-down: its grounded NMOS switches (OR) and when any conducts. */
  down: Map<number, { switches: SwitchNetwork[]; on: Expr; devices: number[] }>;
}

const memo = new WeakMap<ExtractContext, Steering>();

function steering(cx: ExtractContext): Steering {
  let s = memo.get(cx);
  if (!s) memo.set(cx, (s = { is: new Uint8Array(cx.nl.nets.length), down: new Map() }));
  return s;
}

/**
 * A MOS steering node: at least one diode cathode and one NMOS channel end touch it, each NMOS's
 * other channel end is ground (or a negative rail), and otherwise only resistors to ground (a
 * diode-OR node's bleed) — no load, so it is never high of its own accord. Linear in the net's
 * terminals, asked once per net.
 */
export function isMosSteeringNode(cx: ExtractContext, net: number): boolean {
  const s = steering(cx);
  if (s.is[net] === 0) s.is[net] = test(cx, net) ? 1 : 2;
  return s.is[net] === 1;
}

function test(cx: ExtractContext, net: number): boolean {
  if (isRail(cx, net)) return false;
  let cathodes = 0;
  let channels = 0;
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    const dev = cx.nl.devices[d];
    const t = termIdx[i];
    if (dev.kind === 'diode' && t === 1) {
      if (!isMosLine(cx, dev.terminals[0], net)) return false;
      cathodes++;
    }
    else if (dev.kind === 'nmos' && (t === 0 || t === 2)) {
      const far = dev.terminals[t === 0 ? 2 : 0];
      if (!isLowRail(cx, far) || dev.terminals[1] === net) return false;
      channels++;
    } else if (dev.kind === 'nmos' && t === 3) continue; // bulk
    else if (dev.kind === 'resistor' && isLowRail(cx, otherEnd(cx, d, t))) continue;
    else if (dev.kind === 'capacitor') continue;
    else return false;
  }
  return cathodes > 0 && channels > 0;
}

/**
 * A diode's anode sits on a MOS line: a net a MOS channel ends on (an LED or a clamp hanging from a
 * resistor is a load, not a line this node steers).
 */
function isMosLine(cx: ExtractContext, anode: number, node: number): boolean {
  if (anode === node || isRail(cx, anode)) return false;
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[anode], end = offsets[anode + 1]; i < end; i++) {
    const k = cx.nl.devices[termDev[i]].kind;
    if ((k === 'nmos' || k === 'pmos') && (termIdx[i] === 0 || termIdx[i] === 2)) return true;
  }
  return false;
}

function pullDownOf(cx: ExtractContext, net: number): { switches: SwitchNetwork[]; on: Expr; devices: number[] } {
  const s = steering(cx);
  let hit = s.down.get(net);
  if (hit) return hit;
  const switches: SwitchNetwork[] = [];
  const ons: Expr[] = [];
  const devices: number[] = [];
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    const dev = cx.nl.devices[d];
    if (dev.kind !== 'nmos' || (termIdx[i] !== 0 && termIdx[i] !== 2)) continue;
    const on = controlOf(cx, dev.terminals[1]);
    switches.push({ type: 'switch', device: d, on });
    ons.push(on);
    devices.push(d);
  }
  hit = { switches, on: ons.length === 1 ? ons[0] : or(...ons), devices };
  s.down.set(net, hit);
  return hit;
}

/**
 * A MOS line's node with what these structures add: the steering nodes its diodes reach pull it
 * low (their NMOS and the diodes join its pull-down and its devices), and a line with no load of
 * its own that hangs from a pulled-up node is high only while that node is. Nodes that are
 * neither come back unchanged.
 */
export function withMosSteering(cx: ExtractContext, node: LogicNode): LogicNode {
  if (node.kind !== 'static' && node.kind !== 'open-collector' && node.kind !== 'wired') return node;
  const group = node.groups[0];
  const { offsets, termDev, termIdx } = cx;
  let extra: SwitchNetwork[] | undefined;
  let on: Expr[] | undefined;
  let devs: number[] | undefined;
  for (let i = offsets[node.net], end = offsets[node.net + 1]; i < end; i++) {
    const d = termDev[i];
    const dev = cx.nl.devices[d];
    if (dev.kind !== 'diode' || termIdx[i] !== 0 || !isMosSteeringNode(cx, dev.terminals[1])) continue;
    const down = pullDownOf(cx, dev.terminals[1]);
    (extra ??= []).push(...down.switches);
    (on ??= []).push(down.on);
    (devs ??= []).push(d, ...down.devices);
  }
  const up = node.pullUps.length === 0 && group && group.openCollector ? nodePullUp(cx, node.net) : undefined;
  // diode-OR taps a later override could steer through belong to the line (diode-taps.ts)
  let taps: number[] | undefined;
  eachDiodeTap(cx, node.net, (d) => {
    if (!devs?.includes(d)) (taps ??= []).push(d);
  });
  if (!extra && !up && !taps) return node;
  let fn = node.fn;
  if (extra && on && devs) {
    const steered = on.length === 1 ? on[0] : or(...on);
    fn = and(fn, not(steered));
    const parts = group.pullDown ? (group.pullDown.type === 'parallel' ? [...group.pullDown.parts, ...extra] : [group.pullDown, ...extra]) : extra;
    group.pullDown = parts.length === 1 ? parts[0] : { type: 'parallel', parts };
    group.pullsLow = or(group.pullsLow, steered);
    // a load-pulled line is high only while nothing, the steering node included, pulls it low
    if (!group.pullUp && node.pullUps.length) group.pullsHigh = and(group.pullsHigh, not(steered));
    const same = node.devices === group.devices;
    group.devices = [...group.devices, ...devs];
    node.devices = same ? group.devices : [...node.devices, ...devs];
  }
  if (up) {
    fn = withNodePullUp(up, fn);
    node.devices = [...node.devices, ...up.devices];
  }
  if (taps) node.devices = [...node.devices, ...taps];
  node.fn = fn;
  return node;
}
