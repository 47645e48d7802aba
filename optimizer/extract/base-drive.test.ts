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
});
