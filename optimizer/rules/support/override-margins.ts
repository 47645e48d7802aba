// Margin checks of one override transistor (NPN or NMOS) pulling several lines low through
// steering diodes or through a node they share: the current it sinks, its forced β (NPN), where
// its own node settles (NMOS: on-resistance against the load), and the lines' low level against
// their receivers' V_IL.
import { diodeSteeredLowLevel, forcedBetaWorst } from '../../margins/bipolar';
import { corners, describeCorner, round, statusAtMost, worstCorner, type MarginResult } from '../../margins/corners';
import { thresholdsFor, type MarginSettings } from '../../margins/defaults';
import type { MapFamily } from '../../logic/family-parts';

/** What the override's node carries while it is low, as conductances from the supply. */
export interface OverrideLoad {
  /** Paths from the supply through one diode drop (steered line pull-ups; DTL inputs through a line's own resistor), S. */
  lineSiemens: number;
  lines: number;
  /** Paths through two diode drops (DTL inputs on steered lines), S. */
  inputSiemens: number;
  inputs: number;
  /** Resistors straight from the supply onto the node (a shared pull-up node's own pull-up), S. */
  directSiemens: number;
  /** Transistor loads' saturation current, A. */
  loadAmps: number;
}

export const emptyLoad = (): OverrideLoad => ({ lineSiemens: 0, lines: 0, inputSiemens: 0, inputs: 0, directSiemens: 0, loadAmps: 0 });

export function addLoads(a: OverrideLoad, b: OverrideLoad): OverrideLoad {
  return {
    lineSiemens: a.lineSiemens + b.lineSiemens,
    lines: a.lines + b.lines,
    inputSiemens: a.inputSiemens + b.inputSiemens,
    inputs: a.inputs + b.inputs,
    directSiemens: a.directSiemens + b.directSiemens,
    loadAmps: a.loadAmps + b.loadAmps,
  };
}

/** The override transistor: an NPN saturates at V_CE(sat); an NMOS is a level-1 channel (β = KP·W/L, V_T). */
export type OverrideSwitch = { kind: 'npn' } | { kind: 'nmos'; beta: number; vt: number };

/** Current the load pushes into the node at node voltage v (circuit law): a − b·v. */
function linear(vcc: number, load: OverrideLoad, s: MarginSettings, rScale: number): { a: number; b: number } {
  const a = ((vcc - s.vDiode) * load.lineSiemens + (vcc - 2 * s.vDiode) * load.inputSiemens + vcc * load.directSiemens) / rScale + load.loadAmps;
  const b = (load.lineSiemens + load.inputSiemens + load.directSiemens) / rScale;
  return { a, b };
}

/**
 * Where an NMOS override's node settles: the load a − b·v meets the level-1 channel current
 * β·(V_ov·v − v²/2) (triode); when the load wants more than β·V_ov²/2 the channel saturates and
 * the node rises until the load falls to that (Sedra & Smith, square law). Gate driven to `vcc`.
 */
export function nmosNodeVolts(vcc: number, load: OverrideLoad, sw: { beta: number; vt: number }, s: MarginSettings, rScale = 1): number {
  const { a, b } = linear(vcc, load, s, rScale);
  const vov = vcc - sw.vt;
  if (a <= 0) return 0;
  if (vov <= 0) return b > 0 ? Math.min(vcc, a / b) : vcc;
  const p = sw.beta * vov + b;
  const disc = p * p - 2 * sw.beta * a;
  if (disc >= 0) {
    const v = (p - Math.sqrt(disc)) / sw.beta;
    if (v <= vov) return v;
  }
  const iSat = (sw.beta / 2) * vov * vov;
  return b > 0 ? Math.min(vcc, (a - iSat) / b) : vcc;
}

/** The override's own node voltage: V_CE(sat) (nominal or worst) for an NPN, the channel's for an NMOS. */
export function nodeVolts(vcc: number, load: OverrideLoad, sw: OverrideSwitch, s: MarginSettings, rScale = 1, worst = false): number {
  if (sw.kind === 'npn') return worst ? s.vceSatMax : s.vceSat;
  return nmosNodeVolts(vcc, load, sw, s, rScale);
}

/**
 * Current into the override (each path clamped at zero): an NPN's node at V_CE(sat); an NMOS's at
 * 0 V — what the lines ask of it, an upper bound on what its channel carries.
 */
export function overrideCurrentAt(vcc: number, load: OverrideLoad, sw: OverrideSwitch, s: MarginSettings, rScale = 1): number {
  const v = sw.kind === 'npn' ? s.vceSat : 0;
  const line = (Math.max(0, vcc - v - s.vDiode) * load.lineSiemens + Math.max(0, vcc - v - 2 * s.vDiode) * load.inputSiemens + Math.max(0, vcc - v) * load.directSiemens) / rScale;
  return line + load.loadAmps;
}

export function overrideSinkCurrent(input: { vcc: number; load: OverrideLoad; sw: OverrideSwitch; limit?: number }, s: MarginSettings): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  const w = worstCorner(points, (p) => overrideCurrentAt(p.supply, input.load, input.sw, s, p.r['R_pull-up']), 'high');
  const limit = input.limit ?? s.maxCollectorCurrent;
  const { lines, inputs } = input.load;
  const drop = input.sw.kind === 'npn' ? 'V_CE(sat)' : '0 V';
  return {
    name: 'sink current',
    value: w.value,
    limit,
    unit: 'A',
    status: statusAtMost(w.value, limit, s),
    corner: describeCorner(w.point, s),
    note: `Σ (V_CC − ${drop} − V_D)/R over ${lines} line path(s)${inputs ? ` and ${inputs} diode input(s)` : ''}${input.load.directSiemens ? ' and the shared node\'s own pull-up' : ''}${input.load.loadAmps ? ' plus the load transistors\' saturation current' : ''} (circuit law); limit from the settings — check the transistor's data sheet`,
  };
}

/** Forced β = I_C/I_B of an NPN override, base fed through `baseResistor`. */
export function overrideForcedBeta(input: { vcc: number; load: OverrideLoad; baseResistor: number; driveVolts?: number; betaMin: number }, s: MarginSettings): MarginResult {
  return {
    ...forcedBetaWorst(input, (supply, rPullUp) => overrideCurrentAt(supply, input.load, { kind: 'npn' }, s, rPullUp), s),
    note: `I_C/I_B ≤ ${s.forcedBetaTarget} is hard saturation (common practice); above β_min = ${round(input.betaMin)} the override leaves saturation and the lines' low level rises`,
  };
}

/** The receiver family with the lowest V_IL (first of equals), and that V_IL at `supply`. */
function lowestVil(receivers: readonly MapFamily[], supply: number, s: MarginSettings): { family: MapFamily; vil: number } {
  let best = { family: receivers[0], vil: thresholdsFor(receivers[0], supply, s).vil };
  for (const r of receivers) {
    const vil = thresholdsFor(r, supply, s).vil;
    if (vil < best.vil) best = { family: r, vil };
  }
  return best;
}

/**
 * Diode-steered low level against the receivers that read the lines: the lowest V_IL among
 * them decides (a plain RTL input turns on near 0.5 V; a DTL input with two level-shift diodes
 * only near V_D + V_BE ≈ 1.4 V — common practice).
 */
export function steeredLowLevel(vcc: number, receivers: readonly MapFamily[], s: MarginSettings): MarginResult {
  const results = [...new Set(receivers)].map((r) => ({ r, m: diodeSteeredLowLevel({ vcc, receiver: r }, s) }));
  const worst = results.reduce((w, x) => (x.m.limit < w.m.limit ? x : w));
  return { ...worst.m, note: `${worst.m.note}; receiver ${worst.r.toUpperCase()} (V_IL ${worst.m.limit} V)` };
}

/**
 * Low level of lines pulled through an NMOS override and `diodes` steering diodes (0 when the
 * override acts on a node the lines' diodes already join): the channel's node voltage at the
 * corner of most current plus the worst diode drop, against the lowest receiver V_IL there.
 */
export function mosSteeredLowLevel(input: { vcc: number; load: OverrideLoad; sw: { beta: number; vt: number }; receivers: readonly MapFamily[]; name?: string }, s: MarginSettings): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  // CMOS thresholds follow the supply: the corner with the least margin, not the highest level, decides.
  const at = (p: (typeof points)[number]) => nmosNodeVolts(p.supply, input.load, input.sw, s, p.r['R_pull-up']) + s.vDiodeMax;
  const w = worstCorner(points, (p) => at(p) - lowestVil(input.receivers, p.supply, s).vil, 'high');
  w.value = at(w.point);
  const r = lowestVil(input.receivers, w.point.supply, s);
  return {
    name: input.name ?? 'diode-steered low level',
    value: w.value,
    limit: r.vil,
    unit: 'V',
    status: statusAtMost(w.value, r.vil, s),
    corner: describeCorner(w.point, s),
    note: `V_DS(on) of the NMOS override (level 1, β = ${round(input.sw.beta)} A/V², V_T ${round(input.sw.vt)} V, gate at V_CC) + V_D ${s.vDiodeMax} V; receiver ${r.family.toUpperCase()} (V_IL ${round(r.vil)} V) — confirm with a circuit simulator and the data sheets`,
  };
}

/** One line hanging from a shared pull-up node: its own resistor and the DTL inputs that feed it. */
export interface HungLine {
  ohms: number;
  /** Σ 1/R_P of diode inputs on the line, S. */
  inputSiemens: number;
  receivers: readonly MapFamily[];
}

/**
 * Low level of lines whose pull-ups hang from the node the override pulls: each line sits at the
 * node's voltage plus what its DTL inputs push through its own resistor, solved as a divider
 * V = (V_S + R·G_in·(V_CC − V_D)) / (1 + R·G_in) (circuit law), at most V_D + V_BE where the DTL
 * input's own base clamps it (common practice). The line with the least margin to its receivers'
 * V_IL is reported.
 */
export function hungLowLevel(input: { vcc: number; load: OverrideLoad; sw: OverrideSwitch; lines: readonly HungLine[] }, s: MarginSettings): MarginResult {
  const points = corners(input.vcc, ['R_pull-up'] as const, s);
  let worst: { value: number; limit: number; family: MapFamily; point: (typeof points)[number] } | undefined;
  for (const p of points) {
    const vs = nodeVolts(p.supply, input.load, input.sw, s, p.r['R_pull-up'], true);
    for (const l of input.lines) {
      const rg = l.ohms * l.inputSiemens; // the ratio is unchanged when every resistor moves together
      // A DTL input's diode node is clamped by its level-shift diodes and base at 2·V_D + V_BE,
      // so the line it feeds rises no higher than V_D + V_BE — where that receiver reads a 1.
      const v = rg > 0 ? Math.min((vs + rg * (p.supply - s.vDiode)) / (1 + rg), Math.max(vs, s.vDiode + s.vbe)) : vs;
      const r = lowestVil(l.receivers, p.supply, s);
      if (!worst || v - r.vil > worst.value - worst.limit) worst = { value: v, limit: r.vil, family: r.family, point: p };
    }
  }
  const w = worst!;
  return {
    name: 'low level through the shared node',
    value: w.value,
    limit: w.limit,
    unit: 'V',
    status: statusAtMost(w.value, w.limit, s),
    corner: describeCorner(w.point, s),
    note: `the shared node at ${input.sw.kind === 'npn' ? `V_CE(sat) ${s.vceSatMax} V` : "the NMOS override's V_DS(on)"} plus the receivers' input current through each line's own resistor (circuit law); receiver ${w.family.toUpperCase()} (V_IL ${round(w.limit)} V)`,
  };
}
