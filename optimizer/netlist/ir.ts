// The netlist intermediate representation every reader produces and every analysis consumes.
// Two layers: a hierarchical Design (cells, instances — what the files say) and a FlatNetlist
// (every device with its instance path, nets numbered — what the analyses walk).

/** Where something came from in an input file; lines and columns count from 1. */
export interface SourceLoc {
  file: string;
  line: number;
  col: number;
}

/** Transistor-level and passive devices, independent sources, and gate-level primitives. */
export type DeviceKind =
  | 'npn'
  | 'pnp'
  | 'nmos'
  | 'pmos'
  | 'resistor'
  | 'capacitor'
  | 'diode'
  | 'vsource'
  | 'isource'
  | 'gate';

/** Gate-level primitive operations (IEEE 1364 names where the standard has them). */
export type GateOp =
  | 'buf'
  | 'not'
  | 'and'
  | 'or'
  | 'nand'
  | 'nor'
  | 'xor'
  | 'xnor'
  | 'bufif0'
  | 'bufif1'
  | 'notif0'
  | 'notif1'
  | 'pullup'
  | 'pulldown'
  | 'latch'
  | 'dff';

/**
 * Terminal order per kind — fixed, so analyses index `terminals` directly:
 *   npn/pnp:   [collector, base, emitter] (+ substrate when given)
 *   nmos/pmos: [drain, gate, source, bulk]
 *   resistor, capacitor: [a, b]
 *   diode:     [anode, cathode]
 *   vsource/isource: [plus, minus]
 *   gate:      [output, ...inputs]; bufif/notif: [output, data, enable];
 *              latch: [q, d, enable]; dff: [q, d, clock]; pullup/pulldown: [net]
 */
export const TERMINAL_NAMES: Record<Exclude<DeviceKind, 'gate'>, readonly string[]> = {
  npn: ['c', 'b', 'e', 's'],
  pnp: ['c', 'b', 'e', 's'],
  nmos: ['d', 'g', 's', 'b'],
  pmos: ['d', 'g', 's', 'b'],
  resistor: ['a', 'b'],
  capacitor: ['a', 'b'],
  diode: ['a', 'k'],
  vsource: ['p', 'n'],
  isource: ['p', 'n'],
};

export type ParamValue = number | string;

/** A device as written inside a cell; terminals are net names local to that cell. */
export interface Device {
  name: string;
  kind: DeviceKind;
  /** Only for kind 'gate'. */
  op?: GateOp;
  terminals: string[];
  /** Ohms for resistors, farads for capacitors, volts/amps (DC) for sources. */
  value?: number;
  /** Model name for transistors and diodes, as written (resolved case-insensitively). */
  model?: string;
  /** Instance parameters (W, L, AREA, source waveforms …) kept verbatim for writing back. */
  params: Record<string, ParamValue>;
  /** A source's non-DC specification (PULSE, PWL …) kept verbatim: it is stimulus, not a rail. */
  waveform?: string;
  loc?: SourceLoc;
}

/** A model card (.model NAME TYPE (params)). */
export interface Model {
  name: string;
  /** npn, pnp, nmos, pmos, d … lower case. */
  type: string;
  params: Record<string, ParamValue>;
  loc?: SourceLoc;
}

/** An instance of a cell inside another cell. */
export interface Instance {
  name: string;
  cell: string;
  /** Net names in this cell, matched by position to the child cell's ports. */
  connections: string[];
  params: Record<string, ParamValue>;
  loc?: SourceLoc;
}

/** A subcircuit / module definition. */
export interface Cell {
  name: string;
  ports: string[];
  /** Port directions where the format states them (Verilog); SPICE leaves them out. */
  directions?: Record<string, 'input' | 'output' | 'inout'>;
  devices: Device[];
  instances: Instance[];
  /** Net declarations with a resolution kind (Verilog tri/wand/wor/supply0/supply1). */
  netKinds?: Record<string, 'wire' | 'tri' | 'wand' | 'wor' | 'supply0' | 'supply1'>;
  loc?: SourceLoc;
}

export type Format = 'spice' | 'verilog' | 'json' | 'pla';

/** A whole design as read from one file. The top cell holds the top-level cards. */
export interface Design {
  title: string;
  format: Format;
  top: string;
  cells: Record<string, Cell>;
  models: Record<string, Model>;
  /** Nets global to every cell (.global, plus ground "0"). */
  globals: string[];
  /** Numeric parameters from .param, already substituted where used. */
  params: Record<string, number>;
  /** Cards or statements kept for writing back unchanged (.tran, .control …), with their place. */
  extraCards: { text: string; loc?: SourceLoc }[];
}

/** Conventional name of the ground net; "gnd" and "vss" aliases are mapped onto it by readers. */
export const GROUND = '0';

/** A device after flattening: terminals are net ids, path is the instance path from the top. */
export interface FlatDevice {
  /** Full hierarchical name, e.g. "XSLICE3.XEN.Q1". */
  name: string;
  kind: DeviceKind;
  op?: GateOp;
  terminals: number[];
  value?: number;
  model?: string;
  params: Record<string, ParamValue>;
  waveform?: string;
  /** Instance path from the top cell, e.g. ["XSLICE3", "XEN"]; empty for top-level devices. */
  path: string[];
  /** The cell the device was written in. */
  cell: string;
  loc?: SourceLoc;
}

export interface FlatNet {
  id: number;
  /** Hierarchical name of the net's highest-level appearance, e.g. "XSLICE3.N5" or "EN". */
  name: string;
  kind?: 'wire' | 'tri' | 'wand' | 'wor' | 'supply0' | 'supply1';
}

/** A net held at a DC voltage by an independent source to ground (or a Verilog supply net). */
export interface Rail {
  net: number;
  volts: number;
  /** Source device that makes it a rail (absent for supply nets and ground). */
  source?: string;
}

export interface FlatNetlist {
  title: string;
  devices: FlatDevice[];
  nets: FlatNet[];
  netByName: Map<string, number>;
  rails: Rail[];
  /** Top cell's ports (for a SPICE deck without a top subcircuit: empty). */
  ports: number[];
  models: Record<string, Model>;
}
