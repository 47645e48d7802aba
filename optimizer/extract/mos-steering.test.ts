// Diode steering onto a grounded NMOS drain and diode-OR nodes: the steered lines' functions
// (truth table), the steering node left out of the view, the devices each line takes, and the
// look-alikes (an LED on an open drain) that stay as they were.
import { describe, expect, it } from 'vitest';
import { netlist } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { nodeNamed, sameFunction } from './test-helpers';
import { extractLogic } from './index';
import type { LogicView } from './types';

const find = (view: LogicView, name: string) => view.nodes.find((x) => x.name === name);
const node = nodeNamed;
const names = (nl: FlatNetlist, devs: number[]) => devs.map((d) => nl.devices[d].name);

describe('NMOS steering node', () => {
  /**
   * Wren-8 NMOS bits: Y<k> pulled up by RL<k>, pulled low by MD<k> (gate D<k>); a steering diode
   * DS<k> from each line onto N, which one NMOS MK (gate CLR) pulls to ground.
   */
  function steered(n: number, load: 'resistor' | 'depletion'): FlatNetlist {
    const b = netlist().rail('VCC', 5).model('ND', 'nmos', { VTO: -2, KP: 2e-5 }).model('DN', 'd', { IS: 1e-14 });
    b.nmos('MK', 'N', 'CLR', '0');
    for (let k = 0; k < n; k++) {
      if (load === 'resistor') b.resistor(`RL${k}`, 'VCC', `Y${k}`, 47000);
      else b.nmos(`ML${k}`, 'VCC', `Y${k}`, `Y${k}`, { model: 'ND' });
      b.nmos(`MD${k}`, `Y${k}`, `D${k}`, '0').diode(`DS${k}`, `Y${k}`, 'N', { model: 'DN' });
    }
    return b.build();
  }

  it.each(['resistor', 'depletion'] as const)('lines with a %s load: Y = !(D | CLR), N is no node of its own', (load) => {
    const nl = steered(3, load);
    const view = extractLogic(nl);
    expect(find(view, 'N')).toBeUndefined();
    for (let k = 0; k < 3; k++) {
      const y = node(view, `Y${k}`);
      expect(sameFunction(y.fn, `!(D${k} | CLR)`)).toBe(true);
      expect(names(nl, y.devices)).toEqual(expect.arrayContaining([`DS${k}`, 'MK']));
      expect(sameFunction(y.groups[0].pullsLow, `D${k} | CLR`)).toBe(true);
    }
    // MK is explained by the lines it steers
    expect(view.diagnostics.some((d) => d.code === 'extract.unexplained')).toBe(false);
  });

  it('an LED from a resistor onto an open drain is a load, not a steered line: the drain stays an open-drain node', () => {
    const nl = netlist().rail('VCC', 5).resistor('RLED', 'VCC', 'A', 330).diode('DLED', 'A', 'N').nmos('MK', 'N', 'G', '0').build();
    const n = node(extractLogic(nl), 'N');
    expect(sameFunction(n.fn, '!G')).toBe(true);
    expect(n.kind).toBe('open-collector');
  });
});

describe('diode-OR node the lines share', () => {
  /** Bipolar bits: Y<k> with its own pull-up and driver, a diode DZ<k> onto ANY (bled to ground). */
  function diodeOr(n: number, override: boolean): FlatNetlist {
    const b = netlist().rail('VCC', 5).resistor('RANY', 'ANY', '0', 10000);
    if (override) b.resistor('RKS', 'CLR', 'BKS', 2200).npn('QS', 'ANY', 'BKS', '0');
    for (let k = 0; k < n; k++) {
      b.resistor(`RC${k}`, 'VCC', `Y${k}`, 1000).diode(`DZ${k}`, `Y${k}`, 'ANY');
      b.resistor(`RD${k}`, `D${k}`, `BD${k}`, 4700).npn(`QD${k}`, `Y${k}`, `BD${k}`, '0');
    }
    return b.build();
  }

  it('without an override: each line keeps its function and takes its diode tap', () => {
    const nl = diodeOr(3, false);
    const view = extractLogic(nl);
    for (let k = 0; k < 3; k++) {
      const y = node(view, `Y${k}`);
      expect(sameFunction(y.fn, `!D${k}`)).toBe(true);
      expect(names(nl, y.devices)).toContain(`DZ${k}`);
    }
  });

  it('with an override on ANY: its bleed does not stop it steering, Y = !(D | CLR)', () => {
    const view = extractLogic(diodeOr(3, true));
    expect(find(view, 'ANY')).toBeUndefined();
    for (let k = 0; k < 3; k++) expect(sameFunction(node(view, `Y${k}`).fn, `!(D${k} | CLR)`)).toBe(true);
  });

  it('NMOS lines with a diode onto ANY and one NMOS on ANY: Y = !(D | CLR)', () => {
    const b = netlist().rail('VCC', 5).resistor('RANY', 'ANY', '0', 100000).nmos('MK', 'ANY', 'CLR', '0');
    for (let k = 0; k < 2; k++) b.resistor(`RL${k}`, 'VCC', `Y${k}`, 47000).nmos(`MD${k}`, `Y${k}`, `D${k}`, '0').diode(`DZ${k}`, `Y${k}`, 'ANY');
    const view = extractLogic(b.build());
    for (let k = 0; k < 2; k++) expect(sameFunction(node(view, `Y${k}`).fn, `!(D${k} | CLR)`)).toBe(true);
  });
});
