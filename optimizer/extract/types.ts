// Output of logic extraction: what each driven net computes and which devices make it, the shared
// contract the rules engine, verification and the gate-level writer stand on. Keep it stable.
import type { Diagnostic } from '../errors';
import type { Expr } from '../logic/expr';

/**
 * How a driven net behaves electrically:
 *  static         — always driven by one group (gate output, complementary or load-pulled)
 *  wired          — several independent pull-down groups on one pulled-up net (wired-AND)
 *  open-collector — pulled down here, pulled up elsewhere (or nowhere: needs an outside pull-up)
 *  tristate       — driven only while `enable` holds, otherwise floating (Z)
 *  latch          — part of a cross-coupled pair / storage loop; the net is a state bit
 *  pass           — reached only through pass transistors / transmission gates (`enable` = conducting)
 */
export type NodeKind = 'static' | 'wired' | 'open-collector' | 'tristate' | 'latch' | 'pass';

/** Circuit family of a group: resistor-transistor, diode-transistor, static CMOS, NMOS, gate level. */
export type Family = 'rtl' | 'dtl' | 'cmos' | 'nmos' | 'gate';
/** Family of a whole design: one family, several, or nothing recognised. */
export type DesignFamily = Family | 'mixed' | 'none';

/**
 * A switch network between a net and a rail: series = all must conduct (AND), parallel = any
 * (OR). `on` is the condition under which one switch conducts, over net names.
 */
export type SwitchNetwork =
  | { type: 'switch'; device: number; on: Expr }
  | { type: 'series'; parts: SwitchNetwork[] }
  | { type: 'parallel'; parts: SwitchNetwork[] };

/** A load that pulls a net toward a positive rail when nothing pulls it down. */
export interface PullUp {
  /** Device index: a resistor, or a depletion/always-on load transistor. */
  device: number;
  kind: 'resistor' | 'depletion' | 'gate';
  /** Ohms for a resistor load (absent for transistor and gate-level loads). */
  ohms?: number;
  /** Rail net id and its volts. */
  rail: number;
  railVolts: number;
}

/**
 * How a bipolar transistor's base is driven, resolved back to the nets that drive it:
 *  resistor     — one base resistor from a driving net (input = that net)
 *  resistor-sum — several base resistors summed into one base (RTL: OR of the inputs)
 *  diode-and    — input diodes at a pulled-up node, level-shift diode(s) to the base (DTL: AND)
 *  direct       — the base sits on a driven net with no resistor (direct-coupled)
 */
export interface BaseDrive {
  transistor: number;
  kind: 'resistor' | 'resistor-sum' | 'diode-and' | 'direct';
  /** Net ids of the driving nets. */
  inputs: number[];
  /** Condition under which the base is driven on, over net names. */
  on: Expr;
  /** Base resistors (with ohms) from each driving net, in `inputs` order where resistor-driven. */
  baseResistors: { device: number; ohms?: number; from: number }[];
  /** DTL: input diodes, level-shift diodes, the diode node's pull-up, base bleed resistor. */
  inputDiodes: number[];
  levelShiftDiodes: number[];
  diodePullUp?: PullUp;
  /** Resistor from the base to ground or a negative rail (turn-off bleed), if any. */
  bleed?: number;
  /** Every device of the base network (resistors and diodes). */
  devices: number[];
}

/**
 * One independent driver of a net: a pull-down network (and, for complementary logic, a pull-up
 * network), with the base drives of its bipolar transistors.
 */
export interface DriverGroup {
  family: Family;
  /** Pull-down network to ground (bipolar stack or NMOS network). */
  pullDown?: SwitchNetwork;
  /** Active pull-up network to a positive rail (PMOS network in static CMOS). */
  pullUp?: SwitchNetwork;
  /** Condition under which this group pulls the net low / high. */
  pullsLow: Expr;
  pullsHigh: Expr;
  /** Bipolar transistors' base networks. */
  bases: BaseDrive[];
  /** All devices of this group: switches, base networks and its own load if it has one. */
  devices: number[];
  /** Instance path of the group's switches (common prefix), e.g. ["XSLICE3"]. */
  path: string[];
  /** True when this group has no pull-up of its own (open-collector / open-drain drive). */
  openCollector: boolean;
}

/** What one driven net computes. */
export interface LogicNode {
  net: number;
  name: string;
  kind: NodeKind;
  family: Family;
  /**
   * The net's function over the names of the nets that feed it directly (its fan-in), which are
   * other driven nets, primary inputs or state bits. For latch nets: the next-state function.
   * For tristate/pass nets: the value while `enable` holds.
   */
  fn: Expr;
  /** Names of the nets `fn` reads. */
  inputs: string[];
  /** Every device that makes this net's value (groups, loads, base networks). */
  devices: number[];
  /** The net's load (first one if several). */
  pullUp?: PullUp;
  /** Every load on the net (a wired net pulled up in several places lists them all). */
  pullUps: PullUp[];
  groups: DriverGroup[];
  /** Condition under which the net is driven (tristate and pass nets). */
  enable?: Expr;
  /** For a cross-coupled pair: the partner net id. */
  partner?: number;
}

export interface LogicView {
  title: string;
  nodes: LogicNode[];
  /** Net id → index into `nodes`. */
  nodeByNet: Map<number, number>;
  /** Nets read by some group but driven by none (and not rails), by name. */
  inputs: string[];
  /** Latch / loop nets, cut for analysis: pseudo inputs (their value) and outputs (their fn). */
  stateBits: string[];
  /** Rails by net id → volts. */
  rails: Map<number, number>;
  family: DesignFamily;
  familyCounts: Partial<Record<Family, number>>;
  /** Structures the extractor could not explain (with device names), never silently dropped. */
  diagnostics: Diagnostic[];
}
