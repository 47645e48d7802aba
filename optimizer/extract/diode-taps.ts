// Diodes from a line onto a node that a pull-down could steer (a diode-OR node bled to ground, or
// a common override node): part of the line's devices, so a cut of the design around the line
// keeps them and a rewrite that puts an override on that node is extracted with its diodes.
import { isLowRail, isRail, otherEnd, type ExtractContext } from './context';

/** Per net: 0 not asked yet, 1 a diode node, 2 not. */
const memo = new WeakMap<ExtractContext, Uint8Array>();

/** A resistor to ground or a negative rail (a bleed), or a capacitor: neither drives a node high. */
export function isBleed(cx: ExtractContext, dev: number, term: number): boolean {
  const k = cx.nl.devices[dev].kind;
  return k === 'capacitor' || (k === 'resistor' && isLowRail(cx, otherEnd(cx, dev, term)));
}

/**
 * A node only diode cathodes, bleeds and pull-downs (NPN collectors, NMOS channels) touch, with at
 * least one cathode: nothing holds it high but the diodes' anodes. Asked once per net.
 */
export function isDiodeNode(cx: ExtractContext, net: number): boolean {
  let m = memo.get(cx);
  if (!m) memo.set(cx, (m = new Uint8Array(cx.nl.nets.length)));
  if (m[net] === 0) m[net] = test(cx, net) ? 1 : 2;
  return m[net] === 1;
}

function test(cx: ExtractContext, net: number): boolean {
  if (isRail(cx, net)) return false;
  let cathodes = 0;
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    const k = cx.nl.devices[d].kind;
    const t = termIdx[i];
    if (k === 'diode' && t === 1) cathodes++;
    else if ((k === 'npn' && t === 0) || (k === 'nmos' && t !== 1) || isBleed(cx, d, t)) continue;
    else return false;
  }
  return cathodes > 0;
}

/** Calls fn for every diode whose anode is on `net` and whose cathode is on a diode node. */
export function eachDiodeTap(cx: ExtractContext, net: number, fn: (diode: number) => void): void {
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    const dev = cx.nl.devices[d];
    if (dev.kind === 'diode' && termIdx[i] === 0 && dev.terminals[1] !== net && isDiodeNode(cx, dev.terminals[1])) fn(d);
  }
}
