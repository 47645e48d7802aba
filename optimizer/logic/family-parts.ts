// Parts one gate costs in each circuit family: the textbook counts the mapper and cost model use.
// RTL and DTL after Mano, Digital Design, chapter on digital integrated circuits (from memory);
// static CMOS after Weste & Harris, CMOS VLSI Design (from memory); NMOS with a resistor load is
// one pull-down transistor per input and one load resistor (common practice).
import { InternalError } from '../errors';

export type MapFamily = 'rtl' | 'dtl' | 'cmos' | 'nmos' | 'gate';
export type MapGateOp = 'not' | 'nand' | 'nor';

export interface PartCount {
  transistors: number;
  resistors: number;
  diodes: number;
  /** Gate primitives (counted for gate-level designs). */
  gates: number;
}

export const ZERO_PARTS: Readonly<PartCount> = Object.freeze({ transistors: 0, resistors: 0, diodes: 0, gates: 0 });

export function addParts(a: PartCount, b: PartCount, times = 1): PartCount {
  return {
    transistors: a.transistors + times * b.transistors,
    resistors: a.resistors + times * b.resistors,
    diodes: a.diodes + times * b.diodes,
    gates: a.gates + times * b.gates,
  };
}

/** Which two-level forms a family builds natively. */
export const FAMILY_FORMS: Record<MapFamily, readonly ('nand' | 'nor')[]> = {
  rtl: ['nor'],
  dtl: ['nand'],
  cmos: ['nand', 'nor'],
  nmos: ['nor', 'nand'],
  gate: ['nand', 'nor'],
};

/** Parts of one gate with `fanIn` inputs (an inverter is a one-input gate of the family). */
export function gateParts(family: MapFamily, op: MapGateOp, fanIn: number): PartCount {
  if (!Number.isInteger(fanIn) || fanIn < 1) throw new InternalError(`gate with ${fanIn} inputs`);
  const n = op === 'not' ? 1 : fanIn;
  switch (family) {
    case 'rtl':
      // RTL NOR-n: one transistor per input, n base resistors + 1 collector resistor; inverter = NOR-1.
      if (op === 'nand') throw new InternalError('resistor-transistor logic has no native NAND in this mapper');
      return { transistors: n, resistors: n + 1, diodes: 0, gates: 1 };
    case 'dtl':
      // DTL NAND-n: 1 transistor, n input diodes + 2 level-shift diodes, 3 resistors; inverter = NAND-1.
      if (op === 'nor') throw new InternalError('diode-transistor logic has no native NOR in this mapper');
      return { transistors: 1, resistors: 3, diodes: n + 2, gates: 1 };
    case 'cmos':
    case 'gate':
      // Static CMOS NAND-n / NOR-n: 2n transistors; inverter 2.
      return { transistors: 2 * n, resistors: 0, diodes: 0, gates: 1 };
    case 'nmos':
      // NMOS with resistor load: n pull-down transistors (parallel for NOR, series for NAND) + 1 load.
      return { transistors: n, resistors: 1, diodes: 0, gates: 1 };
  }
}

/** Total discrete parts, the figure the mapper minimises (transistors break ties). */
export function partTotal(p: PartCount): number {
  return p.transistors + p.resistors + p.diodes;
}
