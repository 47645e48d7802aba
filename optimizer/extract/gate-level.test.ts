// The gate-level view and composed functions: a transistor-level design and its gate-level view
// are proved equivalent; tri-state nets become bufif1; latch nets are cut into state bits.
import { describe, expect, it } from 'vitest';
import { netlist } from '../netlist/build';
import { flatten } from '../netlist/flatten';
import { evaluate } from '../logic/expr';
import { checkEquivalence } from '../verify/equivalence';
import { extractLogic } from './index';
import { toGateLevel } from './gate-level';
import { combinationalModel, ENABLE_SUFFIX, NEXT_SUFFIX } from './compose';

describe('toGateLevel', () => {
  it('an RTL NOR feeding a DTL NAND and its gate-level view compute the same outputs', () => {
    //  N = NOR(A, B) (RTL);  Y = NAND(N, C) (DTL)
    const b = netlist().rail('VCC', 5);
    b.resistor('RC1', 'VCC', 'N', 640).resistor('RA', 'A', 'BA', 450).resistor('RB', 'B', 'BB', 450);
    b.npn('QA', 'N', 'BA', '0').npn('QB', 'N', 'BB', '0');
    b.resistor('RP', 'VCC', 'P', 2e3).diode('D1', 'P', 'N').diode('D2', 'P', 'C').diode('DS1', 'P', 'X').diode('DS2', 'X', 'BY');
    b.resistor('RBY', 'BY', '0', 5e3).npn('QY', 'Y', 'BY', '0').resistor('RCY', 'VCC', 'Y', 2e3);
    const view = extractLogic(b.build());
    const design = toGateLevel(view);
    expect(design.cells.top.devices.every((d) => d.kind === 'gate')).toBe(true);
    const gateView = extractLogic(flatten(design));
    expect(gateView.family).toBe('gate');
    const before = combinationalModel(view, ['Y', 'N']).outputs;
    const after = combinationalModel(gateView, ['Y', 'N']).outputs;
    expect(checkEquivalence(before, after).verdict).toBe('proved');
    // and the function is the textbook one: Y = !(!(A | B) & C)
    expect(evaluate(before.Y, { A: 0, B: 0, C: 1 })).toBe(0);
    expect(evaluate(before.Y, { A: 1, B: 0, C: 1 })).toBe(1);
  });

  it('a tri-state CMOS inverter becomes a bufif1 on its enable, and the enable is an output', () => {
    const nl = netlist()
      .rail('VDD', 5)
      .pmos('P1', 'm1', 'ENB', 'VDD', { bulk: 'VDD' })
      .pmos('P2', 'Y', 'A', 'm1', { bulk: 'VDD' })
      .nmos('N2', 'Y', 'A', 'm2')
      .nmos('N1', 'm2', 'EN', '0')
      .build();
    const view = extractLogic(nl);
    const design = toGateLevel(view);
    expect(design.cells.top.devices.some((d) => d.op === 'bufif1' && d.terminals[0] === 'Y')).toBe(true);
    expect(design.cells.top.netKinds?.Y).toBe('tri');
    const model = combinationalModel(view, ['Y']);
    expect(Object.keys(model.outputs).sort()).toEqual(['Y', `Y${ENABLE_SUFFIX}`]);
    const gate = combinationalModel(extractLogic(flatten(design)), ['Y']);
    expect(checkEquivalence(model.outputs, gate.outputs).verdict).toBe('proved');
  });

  it('a cross-coupled latch is cut: state bits are inputs and their next states are outputs', () => {
    const nl = netlist().gate('G1', 'nor', ['Q', 'R', 'QB']).gate('G2', 'nor', ['QB', 'S', 'Q']).build();
    const view = extractLogic(nl);
    const model = combinationalModel(view);
    expect(model.inputs.sort()).toEqual(['Q', 'QB', 'R', 'S']);
    expect(Object.keys(model.outputs).sort()).toEqual([`Q${NEXT_SUFFIX}`, `QB${NEXT_SUFFIX}`]);
    expect(evaluate(model.outputs[`Q${NEXT_SUFFIX}`], { R: 0, S: 0, Q: 1, QB: 0 })).toBe(1);
    expect(evaluate(model.outputs[`Q${NEXT_SUFFIX}`], { R: 1, S: 0, Q: 1, QB: 0 })).toBe(0);
  });
});
