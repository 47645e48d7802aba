// Bridges PLA tables and gate-level designs: a PLA becomes an AND–OR design (one AND per cube,
// one OR per output, shared input inverters); a small combinational gate-level design becomes a
// PLA by exhaustive evaluation (one cube per true minterm, type f).
import { dict, own } from '../../netlist/own';
import { InputError } from '../../errors';
import type { Cell, Design, Device, GateOp } from '../../netlist/ir';
import { flatten } from '../../netlist/flatten';
import type { Pla } from './pla';

export const PLA_TOP = 'PLA';
const CONST1 = 'CONST1';
const CONST0 = 'CONST0';

export function plaToDesign(pla: Pla, title = 'PLA'): Design {
  const devices: Device[] = [];
  const gate = (name: string, op: GateOp, terminals: string[]) => devices.push({ name, kind: 'gate', op, terminals, params: {} });
  // Inner nets never take a port's name (an input called a_N or CUBE0 would otherwise be shorted
  // to the net of that name): a taken name gets a number.
  const taken = new Set([...pla.inputs, ...pla.outputs]);
  const fresh = (base: string) => {
    let name = base;
    for (let k = 2; taken.has(name); k++) name = `${base}_${k}`;
    taken.add(name);
    return name;
  };
  const inverse = new Map<number, string>();
  const invert = (i: number) => {
    let net = inverse.get(i);
    if (net === undefined) inverse.set(i, (net = fresh(`${pla.inputs[i]}_N`)));
    return net;
  };
  const netKinds = dict<NonNullable<Cell['netKinds']>[string]>();
  const constants: Partial<Record<'supply0' | 'supply1', string>> = {};
  const constant = (kind: 'supply0' | 'supply1') => {
    let net = constants[kind];
    if (net === undefined) netKinds[(net = constants[kind] = fresh(kind === 'supply1' ? CONST1 : CONST0))] = kind;
    return net;
  };
  const cubeNets: string[] = [];
  pla.cubes.forEach((c, k) => {
    const lits: string[] = [];
    for (let i = 0; i < c.in.length; i++) {
      if (c.in[i] === '1') lits.push(pla.inputs[i]);
      else if (c.in[i] === '0') lits.push(invert(i));
    }
    if (lits.length === 0) cubeNets.push(constant('supply1'));
    else if (lits.length === 1) cubeNets.push(lits[0]);
    else {
      const net = fresh(`CUBE${k}`);
      gate(`AND${k}`, 'and', [net, ...lits]);
      cubeNets.push(net);
    }
  });
  for (const i of [...inverse.keys()].sort((a, b) => a - b)) gate(`INV_${pla.inputs[i]}`, 'not', [inverse.get(i)!, pla.inputs[i]]);
  pla.outputs.forEach((o, j) => {
    // fr/fdr list the off-set too; the on-set (1s) defines the function either way.
    const terms = pla.cubes.flatMap((c, k) => (c.out[j] === '1' ? [cubeNets[k]] : []));
    if (terms.length === 0) gate(`OR_${o}`, 'buf', [o, constant('supply0')]);
    else if (terms.length === 1) gate(`OR_${o}`, 'buf', [o, terms[0]]);
    else gate(`OR_${o}`, 'or', [o, ...terms]);
  });
  const directions = dict<'input' | 'output'>();
  for (const i of pla.inputs) directions[i] = 'input';
  for (const o of pla.outputs) directions[o] = 'output';
  const cell: Cell = { name: PLA_TOP, ports: [...pla.inputs, ...pla.outputs], directions, devices, instances: [] };
  if (Object.keys(netKinds).length > 0) cell.netKinds = netKinds;
  return { title, format: 'pla', top: PLA_TOP, cells: { [PLA_TOP]: cell }, models: {}, globals: [], params: {}, extraCards: [] };
}

const MAX_PLA_INPUTS = 16;
const EVAL: Partial<Record<GateOp, (x: boolean[]) => boolean>> = {
  buf: (x) => x[0],
  not: (x) => !x[0],
  and: (x) => x.every(Boolean),
  nand: (x) => !x.every(Boolean),
  or: (x) => x.some(Boolean),
  nor: (x) => !x.some(Boolean),
  xor: (x) => x.reduce((a, b) => a !== b, false),
  xnor: (x) => !x.reduce((a, b) => a !== b, false),
};

export function designToPla(design: Design): Pla {
  const flat = flatten(design);
  const top = design.cells[design.top];
  const inputs = top.ports.filter((p) => own(top.directions, p) === 'input');
  const outputs = top.ports.filter((p) => own(top.directions, p) === 'output');
  if (inputs.length === 0 || outputs.length === 0) {
    throw InputError.at('pla.write-ports', 'a PLA needs a top cell with input and output ports (a gate-level design with port directions)');
  }
  if (inputs.length > MAX_PLA_INPUTS) throw InputError.at('pla.write-size', `a PLA is written by exhaustive evaluation: at most ${MAX_PLA_INPUTS} inputs, found ${inputs.length}`);
  const driver = new Map<number, (typeof flat.devices)[number]>();
  for (const d of flat.devices) {
    if (d.kind !== 'gate' || !EVAL[d.op!]) throw InputError.at('pla.write-kind', `${d.name} (${d.op ?? d.kind}) is not a combinational gate; only and/or/nand/nor/xor/xnor/not/buf designs can be written as a PLA`, d.loc);
    if (driver.has(d.terminals[0])) throw InputError.at('pla.write-wired', `net ${flat.nets[d.terminals[0]].name} has more than one driver`, d.loc);
    driver.set(d.terminals[0], d);
  }
  const inIds = inputs.map((p) => flat.netByName.get(p)!);
  const outIds = outputs.map((o) => flat.netByName.get(o)!);
  const supply = new Map<number, boolean>();
  for (const n of flat.nets) if (n.kind === 'supply1' || n.kind === 'supply0') supply.set(n.id, n.kind === 'supply1');
  const order = evaluationOrder(outIds, driver, new Set([...inIds, ...supply.keys()]), flat);
  const value = new Uint8Array(flat.nets.length);
  const cubes: Pla['cubes'] = [];
  for (let m = 0; m < 1 << inputs.length; m++) {
    for (const [id, v] of supply) value[id] = v ? 1 : 0;
    inIds.forEach((id, k) => (value[id] = (m >> (inputs.length - 1 - k)) & 1));
    for (const d of order) value[d.terminals[0]] = EVAL[d.op!]!(d.terminals.slice(1).map((t) => value[t] === 1)) ? 1 : 0;
    const out = outIds.map((id) => (value[id] ? '1' : '0')).join('');
    if (out.includes('1')) cubes.push({ in: m.toString(2).padStart(inputs.length, '0'), out });
  }
  return { inputs, outputs, cubes, type: 'f' };
}

type FlatGate = ReturnType<typeof flatten>['devices'][number];

/** Gates feeding the outputs, inputs first; iterative so long gate chains cannot overflow the stack. */
function evaluationOrder(outIds: number[], driver: Map<number, FlatGate>, sources: Set<number>, flat: ReturnType<typeof flatten>): FlatGate[] {
  const order: FlatGate[] = [];
  const state = new Map<number, 1 | 2>(); // 1 on the path, 2 done
  for (const out of outIds) {
    const stack: { net: number; next: number }[] = [{ net: out, next: 1 }];
    while (stack.length > 0) {
      const top = stack[stack.length - 1];
      if (sources.has(top.net) || state.get(top.net) === 2) {
        stack.pop();
        continue;
      }
      const d = driver.get(top.net);
      if (!d) throw InputError.at('pla.write-undriven', `net ${flat.nets[top.net].name} has no driver and is not an input`);
      state.set(top.net, 1);
      if (top.next < d.terminals.length) {
        const inNet = d.terminals[top.next++];
        if (state.get(inNet) === 1) throw InputError.at('pla.write-loop', `combinational loop through ${flat.nets[inNet].name}`, d.loc);
        stack.push({ net: inNet, next: 1 });
        continue;
      }
      state.set(top.net, 2);
      order.push(d);
      stack.pop();
    }
  }
  return order;
}
