// Checks that a DTL base drive is read from the circuit alone: the same inverter gives the same
// function however its devices and nets happen to be numbered.
import { describe, expect, it } from 'vitest';
import { exprToString } from '../logic/expr';
import { NetlistBuilder } from '../netlist/build';
import { extractLogic } from '.';

/**
 * A DTL inverter Q = NOT A (input diode DI, level-shift diodes DL1 and DL2 into QI's base BI),
 * after `pad` decoupling capacitors on the supply: they move every device number, no net number.
 */
function dtlInverter(pad: number) {
  const b = new NetlistBuilder('Wren-8 enable inverter');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 50 });
  b.model('DX', 'd', { IS: 1e-14 });
  for (let k = 0; k < pad; k++) b.capacitor(`CD${k}`, 'VCC', '0', 1e-7);
  b.resistor('RP', 'VCC', 'P', 4700);
  b.diode('DI', 'P', 'A', { model: 'DX' });
  b.diode('DL1', 'P', 'M', { model: 'DX' });
  b.diode('DL2', 'M', 'BI', { model: 'DX' });
  b.resistor('RB', 'BI', '0', 5000);
  b.resistor('RC', 'VCC', 'Q', 2000);
  b.npn('QI', 'Q', 'BI', '0', { model: 'QN' });
  return b.build();
}

describe('DTL base drive', () => {
  it('reads the same function whatever the numbering, also when a diode number equals the base net number', () => {
    let collided = 0;
    for (let pad = 0; pad <= 12; pad++) {
      const nl = dtlInverter(pad);
      const base = nl.netByName.get('BI')!;
      if (['DI', 'DL1', 'DL2'].some((name) => nl.devices.findIndex((d) => d.name === name) === base)) collided++;
      const view = extractLogic(nl);
      const q = view.nodes.find((n) => n.name === 'Q')!;
      expect([pad, exprToString(q.fn), q.family, view.inputs]).toEqual([pad, '!A', 'dtl', ['A']]);
    }
    // the numbering that once read the base as a free input is among the cases
    expect(collided).toBeGreaterThan(0);
  });

  it("reads a level-shift diode off another stage's pulled-up output as that output, also when the output feeds several such diodes", () => {
    // E = NOT A (RTL inverter QI with pull-up RC); each of Y0, Y1 = NOT E through a diode DBk from E
    const b = new NetlistBuilder('Wren-8 enable fan-out');
    b.rail('VCC', 5);
    b.model('QN', 'npn', { IS: 1e-14, BF: 50 });
    b.model('DX', 'd', { IS: 1e-14 });
    b.resistor('RA', 'A', 'BA', 4700);
    b.npn('QI', 'E', 'BA', '0', { model: 'QN' });
    b.resistor('RC', 'VCC', 'E', 2000);
    for (const k of [0, 1]) {
      b.diode(`DB${k}`, 'E', `B${k}`, { model: 'DX' });
      b.resistor(`RB${k}`, `B${k}`, '0', 5000);
      b.npn(`Q${k}`, `Y${k}`, `B${k}`, '0', { model: 'QN' });
      b.resistor(`RL${k}`, 'VCC', `Y${k}`, 2000);
    }
    const view = extractLogic(b.build());
    const fn = (name: string) => exprToString(view.nodes.find((n) => n.name === name)!.fn);
    // neither the other diode's base (an input diode of a gate) nor a constant (an AND of nothing)
    expect([fn('E'), fn('Y0'), fn('Y1')]).toEqual(['!A', '!E', '!E']);
    expect(view.inputs).toEqual(['A']);
  });
});
