// Lines pulled up through a resistor from a node that is itself pulled up (not a rail): the line is
// high only while that node is high and nothing pulls the line low, line = node ∧ ¬(pull-downs).
// Electrically a divider; the rules' margins check the low level, extraction gives the logic.
import { and, TRUE, type Expr } from '../logic/expr';
import { isHighRail, isRail, otherEnd, varOf, type ExtractContext } from './context';

/** Longest chain of pulled-up nodes followed (rail → node → node …); deeper ones are not read. */
const MAX_LEVEL = 8;

interface Levels {
  /** Resistor steps from a positive rail (1 = a resistor straight to the rail), 0 = not a pull-up node. */
  level: Uint8Array;
  /** Per net: 1 when something drives it low (an NPN collector or a MOS channel), so it is a logic node of its own. */
  driven: Uint8Array;
}

const levelsOf = new WeakMap<ExtractContext, Levels>();

/**
 * A net that can carry a pull-up to lines: only resistors, capacitors, NPN collectors, MOS
 * channels and MOS gates touch it. A transistor base or a diode on the net makes it part of a gate
 * (a base bias, a diode AND), never a pulled-up logic node.
 */
function nodeLike(cx: ExtractContext, net: number, driven: Uint8Array): boolean {
  if (isRail(cx, net)) return false;
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const k = cx.nl.devices[termDev[i]].kind;
    const t = termIdx[i];
    if (k === 'capacitor') continue;
    // a resistor to ground makes a divider or a bleed, not a pulled-up logic node
    if (k === 'resistor') {
      if (isRail(cx, otherEnd(cx, termDev[i], t)) && !isHighRail(cx, otherEnd(cx, termDev[i], t))) return false;
      continue;
    }
    if (k === 'npn' && t === 0) driven[net] = 1;
    else if ((k === 'nmos' || k === 'pmos') && t !== 1 && t !== 3) driven[net] = 1;
    else if ((k === 'nmos' || k === 'pmos') && (t === 1 || t === 3)) continue;
    else return false;
  }
  return true;
}

/**
 * Levels of every pulled-up node, found once per extraction by a breadth-first walk from the
 * positive rails through resistors (each resistor and net visited once: linear in the design).
 */
function levels(cx: ExtractContext): Levels {
  let hit = levelsOf.get(cx);
  if (hit) return hit;
  const n = cx.nl.nets.length;
  const level = new Uint8Array(n);
  const driven = new Uint8Array(n);
  const checked = new Uint8Array(n); // 1 node-like, 2 not
  const like = (net: number) => (checked[net] ||= nodeLike(cx, net, driven) ? 1 : 2) === 1;
  let frontier: number[] = [];
  const { offsets, termDev, termIdx } = cx;
  for (const r of cx.nl.rails) {
    if (!isHighRail(cx, r.net)) continue;
    for (let i = offsets[r.net], end = offsets[r.net + 1]; i < end; i++) {
      const d = termDev[i];
      if (cx.nl.devices[d].kind !== 'resistor') continue;
      const o = otherEnd(cx, d, termIdx[i]);
      if (level[o] === 0 && like(o)) {
        level[o] = 1;
        frontier.push(o);
      }
    }
  }
  for (let step = 2; step <= MAX_LEVEL && frontier.length; step++) {
    const next: number[] = [];
    for (const x of frontier) {
      for (let i = offsets[x], end = offsets[x + 1]; i < end; i++) {
        const d = termDev[i];
        if (cx.nl.devices[d].kind !== 'resistor') continue;
        const o = otherEnd(cx, d, termIdx[i]);
        if (o !== x && level[o] === 0 && like(o)) {
          level[o] = step;
          next.push(o);
        }
      }
    }
    frontier = next;
  }
  hit = { level, driven };
  levelsOf.set(cx, hit);
  return hit;
}

/** The line's pull-up resistor from a pulled-up node and that node, when there is exactly one. */
export interface NodePullUp {
  /** The resistor from the node to the line. */
  device: number;
  /** The pulled-up node it hangs from. */
  node: number;
  /** The condition under which the node is high (its variable, or always for a node nothing drives). */
  high: Expr;
  /**
   * Devices the line's high level rests on: its resistor and, up a chain of nodes nothing drives,
   * their resistors to the rail (a driven node's own load belongs to that node).
   */
  devices: number[];
}

/** Per pulled-up node: when it is high and the resistors that hold it there, worked out once. */
const upMemo = new WeakMap<ExtractContext, Map<number, { high: Expr; devices: number[] }>>();

/**
 * For a line with no resistor to a rail: its pull-up from a pulled-up node — the one resistor
 * whose far end is the nearest pulled-up node to the rail. Several such resistors (two nodes
 * feeding one line) are not read as logic; nor is a line that is itself nearer the rail than the
 * node (that resistor hangs a further node from the line, it does not pull the line up).
 */
export function nodePullUp(cx: ExtractContext, net: number): NodePullUp | undefined {
  const up = upResistor(cx, net);
  if (!up) return undefined;
  const node = nodeHigh(cx, up.node);
  return { device: up.device, node: up.node, high: node.high, devices: [up.device, ...node.devices] };
}

function upResistor(cx: ExtractContext, net: number): { device: number; node: number } | undefined {
  const { level } = levels(cx);
  const { offsets, termDev, termIdx } = cx;
  let best: { device: number; node: number } | undefined;
  let bestLevel = MAX_LEVEL + 1;
  let ties = 0;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    if (cx.nl.devices[d].kind !== 'resistor') continue;
    const x = otherEnd(cx, d, termIdx[i]);
    const lx = level[x];
    if (x === net || lx === 0 || (level[net] !== 0 && lx >= level[net])) continue;
    if (lx < bestLevel) {
      bestLevel = lx;
      best = { device: d, node: x };
      ties = 0;
    } else if (lx === bestLevel) ties++;
  }
  return best && ties === 0 ? best : undefined;
}

/**
 * When a pulled-up node is high: a node something drives is a logic node (its variable, its load
 * its own); one nothing drives follows the node it hangs from, always high at the top of the
 * chain where its resistors go straight to the rail.
 */
function nodeHigh(cx: ExtractContext, node: number): { high: Expr; devices: number[] } {
  let memo = upMemo.get(cx);
  if (!memo) upMemo.set(cx, (memo = new Map()));
  const hit = memo.get(node);
  if (hit) return hit;
  const { level, driven } = levels(cx);
  let out: { high: Expr; devices: number[] };
  if (driven[node]) out = { high: varOf(cx, node), devices: [] };
  else if (level[node] === 1) {
    const devices: number[] = [];
    const { offsets, termDev, termIdx } = cx;
    for (let i = offsets[node], end = offsets[node + 1]; i < end; i++) {
      const d = termDev[i];
      if (cx.nl.devices[d].kind === 'resistor' && isHighRail(cx, otherEnd(cx, d, termIdx[i]))) devices.push(d);
    }
    out = { high: TRUE, devices };
  } else {
    const up = nodePullUp(cx, node);
    out = up ? { high: up.high, devices: up.devices } : { high: varOf(cx, node), devices: [] };
  }
  memo.set(node, out);
  return out;
}

/** A line's function with its node pull-up: high only while the node is high and nothing pulls it low. */
export function withNodePullUp(up: NodePullUp, fn: Expr): Expr {
  return up.high.op === 'const' ? fn : and(up.high, fn);
}
