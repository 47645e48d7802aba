// Maps two-level covers onto a family's cheapest gate form and counts its parts: NAND–NAND for
// diode-transistor, NOR–NOR for resistor-transistor, the cheaper of both for CMOS and NMOS.
// Each output may be built from its own cover or, through an output inversion, from the cover of
// its complement; input inverters are shared by every term and output that needs them.
import { InternalError } from '../errors';
import { type Cover, type Cube, type MultiCover } from './cubes';
import { addParts, FAMILY_FORMS, gateParts, type MapFamily, type MapGateOp, type PartCount, partTotal, ZERO_PARTS } from './family-parts';

/** One gate of the mapped network; signals are input names, "<input>'" complements, or internal. */
export interface MappedGate {
  op: MapGateOp;
  inputs: string[];
  output: string;
}

export interface MappedOutput {
  name: string;
  /** 'not': the output is one literal's complement, made by an inverter of its own. */
  form: 'nand' | 'nor' | 'not' | 'wire' | 'constant';
  /** True when the output was built from its complement's cover. */
  fromComplement: boolean;
  /** For wire: the signal it equals; for constant: its value. */
  source?: string;
  constant?: 0 | 1;
}

export interface MappedNetwork {
  family: MapFamily;
  gates: MappedGate[];
  outputs: MappedOutput[];
  /** Inputs whose complement an input inverter makes (shared). */
  invertedInputs: string[];
  parts: PartCount;
  /** Widest gate in the network (families limit fan-in). */
  maxFanIn: number;
}

export interface MapOptions {
  /** Covers of each output's complement, same order; enables the inverted-output form. */
  complement?: MultiCover;
  /** Inputs whose complement already exists as a net (no inverter needed). */
  freeComplements?: ReadonlySet<string>;
}

export const complementName = (input: string) => `${input}'`;

interface Candidate {
  gates: MappedGate[];
  needs: Set<string>;
  out: MappedOutput;
}

/** The literals of a cube as (input name, positive?) pairs in input order. */
function literals(c: Cube, inputs: string[]): { name: string; positive: boolean }[] {
  const n = inputs.length;
  const out: { name: string; positive: boolean }[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (c.care & bit) out.push({ name: inputs[i], positive: (c.value & bit) !== 0 });
  }
  return out;
}

/**
 * Builds `target` (the output, or its complement when `invert`) from `cover` in one form.
 * NAND–NAND realises the cover's function directly; NOR–NOR realises its complement.
 */
function realise(name: string, cover: Cover, inputs: string[], form: 'nand' | 'nor', invert: boolean): Candidate {
  const gates: MappedGate[] = [];
  const needs = new Set<string>();
  const signal = (lit: { name: string; positive: boolean }, wantPositive: boolean): string => {
    // The signal equal to lit (wantPositive) or to NOT lit.
    const pos = lit.positive === wantPositive;
    if (pos) return lit.name;
    needs.add(lit.name);
    return complementName(lit.name);
  };
  const base = { name, fromComplement: invert };
  if (cover.length === 0 || cover.some((c) => c.care === 0)) {
    const value: 0 | 1 = cover.length === 0 ? 0 : 1;
    return { gates, needs, out: { ...base, form: 'constant', constant: (invert ? 1 - value : value) as 0 | 1 } };
  }
  let tmp = 0;
  const fresh = () => `${name}.t${tmp++}`;
  // `cover` computes G; the wanted output is G (invert false) or NOT G (invert true).
  if (cover.length === 1) {
    const lits = literals(cover[0], inputs);
    if (lits.length === 1) {
      if (lits[0].positive === !invert) return { gates, needs, out: { ...base, form: 'wire', source: lits[0].name } };
      gates.push({ op: 'not', inputs: [lits[0].name], output: name });
      return { gates, needs, out: { ...base, form: 'not' } };
    }
    // G = AND(lits): NAND gives NOT G; NOR of complemented literals gives G.
    const gateOp = form;
    const ins = lits.map((l) => signal(l, form === 'nand'));
    const givesNotG = form === 'nand';
    if (givesNotG === invert) {
      gates.push({ op: gateOp, inputs: ins, output: name });
    } else {
      const t = fresh();
      gates.push({ op: gateOp, inputs: ins, output: t }, { op: 'not', inputs: [t], output: name });
    }
    return { gates, needs, out: { ...base, form } };
  }
  // Two levels: NAND(NAND(terms)) = G; NOR(NOR(complemented terms)) = NOT G.
  const level2: string[] = [];
  for (const c of cover) {
    const lits = literals(c, inputs);
    if (lits.length === 1) {
      // A one-literal term enters level 2 directly: NAND wants NOT lit, NOR wants lit.
      level2.push(signal(lits[0], form === 'nor'));
    } else {
      const t = fresh();
      gates.push({ op: form, inputs: lits.map((l) => signal(l, form === 'nand')), output: t });
      level2.push(t);
    }
  }
  const givesNotG = form === 'nor';
  if (givesNotG === invert) {
    gates.push({ op: form, inputs: level2, output: name });
  } else {
    const t = fresh();
    gates.push({ op: form, inputs: level2, output: t }, { op: 'not', inputs: [t], output: name });
  }
  return { gates, needs, out: { ...base, form } };
}

function gatesParts(family: MapFamily, gates: MappedGate[]): PartCount {
  return gates.reduce((p, g) => addParts(p, gateParts(family, g.op, g.inputs.length)), { ...ZERO_PARTS });
}

/** Maps every output of `cover` to the family's cheapest two-level form and counts the parts. */
export function mapCover(cover: MultiCover, family: MapFamily, options: MapOptions = {}): MappedNetwork {
  const { complement, freeComplements = new Set<string>() } = options;
  if (complement && complement.outputs.length !== cover.outputs.length) {
    throw new InternalError('complement covers do not match the outputs');
  }
  const inputs = cover.inputs;
  const inverted = new Set<string>();
  const gates: MappedGate[] = [];
  const outputs: MappedOutput[] = [];
  const inverterCost = partTotal(gateParts(family, 'not', 1));
  cover.outputs.forEach((o, k) => {
    const candidates: Candidate[] = [];
    for (const form of FAMILY_FORMS[family]) {
      candidates.push(realise(o.name, o.cover, inputs, form, false));
      if (complement) candidates.push(realise(o.name, complement.outputs[k].cover, inputs, form, true));
    }
    // Cost of a candidate = its gates + the input inverters it adds beyond those already built.
    const cost = (c: Candidate) => {
      const own = gatesParts(family, c.gates);
      const extra = [...c.needs].filter((x) => !inverted.has(x) && !freeComplements.has(x)).length;
      return { total: partTotal(own) + extra * inverterCost, transistors: own.transistors };
    };
    let best = candidates[0];
    let bestCost = cost(best);
    for (const c of candidates.slice(1)) {
      const cc = cost(c);
      if (cc.total < bestCost.total || (cc.total === bestCost.total && cc.transistors < bestCost.transistors)) {
        best = c;
        bestCost = cc;
      }
    }
    for (const x of best.needs) if (!freeComplements.has(x)) inverted.add(x);
    gates.push(...best.gates);
    outputs.push(best.out);
  });
  const invertedInputs = inputs.filter((x) => inverted.has(x));
  const all = [...invertedInputs.map((x) => ({ op: 'not' as const, inputs: [x], output: complementName(x) })), ...gates];
  return {
    family,
    gates: all,
    outputs,
    invertedInputs,
    parts: gatesParts(family, all),
    maxFanIn: all.reduce((m, g) => Math.max(m, g.inputs.length), 0),
  };
}

/** Evaluates a mapped network on one input assignment (for tests and cross-checks). */
export function evaluateNetwork(net: MappedNetwork, values: Record<string, boolean>): Record<string, boolean> {
  const sig = new Map<string, boolean>(Object.entries(values));
  for (const g of net.gates) {
    const ins = g.inputs.map((s) => {
      const v = sig.get(s);
      if (v === undefined) throw new InternalError(`mapped gate ${g.output} reads undefined signal ${s}`);
      return v;
    });
    sig.set(g.output, g.op === 'not' ? !ins[0] : g.op === 'nand' ? !ins.every(Boolean) : !ins.some(Boolean));
  }
  const out: Record<string, boolean> = {};
  for (const o of net.outputs) {
    if (o.form === 'constant') out[o.name] = o.constant === 1;
    else if (o.form === 'wire') out[o.name] = sig.get(o.source!)!;
    else out[o.name] = sig.get(o.name)!;
  }
  return out;
}
