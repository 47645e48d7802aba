// Size and pin positions of each schematic symbol, in drawing units, shared by the layout (ports
// at fixed positions) and the renderer (wires meet the drawn pins). Transistors and passives follow
// IEEE 315 / IEC 60617 (zig-zag resistors, consistently); gates follow IEEE 91 distinctive shapes.
import type { RegionPart } from '@/optimizer/region/graph';

export type Side = 'N' | 'S' | 'E' | 'W';
export interface Pin {
  /** Terminal name as in RegionTerminal. */
  name: string;
  x: number;
  y: number;
  side: Side;
}
export interface SymbolGeometry {
  /** Which glyph to draw. */
  glyph: Glyph;
  width: number;
  height: number;
  pins: Pin[];
}

export type Glyph =
  | 'npn' | 'pnp' | 'nmos' | 'pmos' | 'resistor' | 'capacitor' | 'diode' | 'vsource' | 'isource'
  | 'and' | 'or' | 'xor' | 'nand' | 'nor' | 'xnor' | 'not' | 'buf' | 'bufif' | 'notif' | 'pullup' | 'pulldown' | 'latch' | 'dff';

/** Spacing of gate inputs along the back of the symbol. */
export const INPUT_PITCH = 16;
export const GATE_WIDTH = 60;

const pin = (name: string, x: number, y: number, side: Side): Pin => ({ name, x, y, side });

function transistor(glyph: Glyph, names: string[], count: number): SymbolGeometry {
  // collector/drain top right, base/gate left, emitter/source bottom right, substrate/bulk right.
  const all = [pin(names[0], 30, 0, 'N'), pin(names[1], 0, 25, 'W'), pin(names[2], 30, 50, 'S'), pin(names[3], 40, 25, 'E')];
  return { glyph, width: 40, height: 50, pins: all.slice(0, count) };
}

function gate(glyph: Glyph, inputs: string[], extra?: Pin): SymbolGeometry {
  const height = Math.max(40, inputs.length * INPUT_PITCH + 8);
  const top = height / 2 - ((inputs.length - 1) * INPUT_PITCH) / 2;
  const pins = [pin('y', GATE_WIDTH, height / 2, 'E'), ...inputs.map((n, i) => pin(n, 0, top + i * INPUT_PITCH, 'W'))];
  if (extra) pins.push(extra);
  return { glyph, width: GATE_WIDTH, height, pins };
}

export function geometryOf(part: Pick<RegionPart, 'kind' | 'op' | 'terminals'>): SymbolGeometry {
  const n = part.terminals.length;
  const names = part.terminals.map((t) => t.name);
  switch (part.kind) {
    case 'npn':
    case 'pnp':
      return transistor(part.kind, ['c', 'b', 'e', 's'], n);
    case 'nmos':
    case 'pmos':
      return transistor(part.kind, ['d', 'g', 's', 'b'], n);
    case 'resistor':
      return { glyph: 'resistor', width: 20, height: 50, pins: [pin('a', 10, 0, 'N'), pin('b', 10, 50, 'S')] };
    case 'capacitor':
      return { glyph: 'capacitor', width: 24, height: 40, pins: [pin('a', 12, 0, 'N'), pin('b', 12, 40, 'S')] };
    case 'diode':
      return { glyph: 'diode', width: 24, height: 40, pins: [pin('a', 12, 0, 'N'), pin('k', 12, 40, 'S')] };
    case 'vsource':
    case 'isource':
      return { glyph: part.kind, width: 30, height: 50, pins: [pin('p', 15, 0, 'N'), pin('n', 15, 50, 'S')] };
    case 'gate':
      break;
  }
  const op = part.op ?? 'buf';
  const inputs = names.filter((x) => x.startsWith('in'));
  switch (op) {
    case 'and': case 'or': case 'xor': case 'nand': case 'nor': case 'xnor':
      return gate(op, inputs);
    case 'not': case 'buf':
      return gate(op, inputs.length ? inputs : ['in1']);
    case 'bufif0': case 'bufif1': case 'notif0': case 'notif1': {
      const g = gate(op.startsWith('buf') ? 'bufif' : 'notif', ['in1']);
      g.pins.push(pin('en', GATE_WIDTH / 2 - 6, 0, 'N'));
      return { ...g, height: g.height };
    }
    case 'latch':
    case 'dff':
      // IEEE 91 rectangular outline: data and output on the upper row, enable or clock below.
      return { glyph: op, width: GATE_WIDTH, height: 40, pins: [pin('y', GATE_WIDTH, 12, 'E'), pin('in1', 0, 12, 'W'), pin(op === 'dff' ? 'clk' : 'en', 0, 28, 'W')] };
    case 'pullup':
    case 'pulldown':
      return { glyph: op, width: 20, height: 40, pins: [pin('y', 10, op === 'pullup' ? 40 : 0, op === 'pullup' ? 'S' : 'N')] };
  }
  return gate('buf', ['in1']);
}

/** Where a pin's wire leaves the symbol, for the stubs of rails and lone boundary nets. */
export const STUB = 14;
export function stubEnd(p: Pin): { x: number; y: number } {
  const d = { N: [0, -STUB], S: [0, STUB], E: [STUB, 0], W: [-STUB, 0] }[p.side];
  return { x: p.x + d[0], y: p.y + d[1] };
}
