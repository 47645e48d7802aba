// The net index: the loads a shared driver must carry by kind (found through per-net tables, so a
// base resistor tied to a rail with thousands of terminals costs nothing), and one index per
// frozen design shared by every rule of a scan.
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../../extract';
import { NetlistBuilder } from '../../netlist/build';
import type { FlatNetlist } from '../../netlist/ir';
import { deepFreeze } from '../freeze';
import { equivalentBaseResistor, mergeDriverLoads, NetIndex } from './net-index';

/**
 * An RTL inverter driving LDN, read by: two resistor-fed bases (one with its own collector
 * pull-up, one whose collector is pulled up only through another stage's resistor), a DTL input
 * diode whose node is pulled up, and an NMOS gate. `extra` loads VCC with many more terminals.
 */
function design(extra = 0): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 load line');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { BF: 80 });
  b.resistor('RB', 'LOAD', 'B', 4700);
  b.npn('Q1', 'LDN', 'B', '0', { model: 'QN' });
  b.resistor('RC', 'VCC', 'LDN', 1000);
  b.resistor('RBL1', 'LDN', 'BL1', 3300);
  b.npn('QL1', 'OUT1', 'BL1', '0', { model: 'QN' });
  b.resistor('RL1', 'VCC', 'OUT1', 2200);
  b.resistor('RBL2', 'LDN', 'BL2', 6800);
  b.npn('QL2', 'OUT2', 'BL2', '0');
  b.resistor('RL2', 'VCC', 'OUT2', 4700);
  b.diode('DIN', 'DN', 'LDN');
  b.resistor('RDN', 'VCC', 'DN', 3900);
  b.nmos('MG', 'Y', 'LDN', '0');
  b.resistor('RY', 'VCC', 'Y', 10_000);
  for (let i = 0; i < extra; i++) b.resistor(`RX${i}`, 'VCC', `X${i}`, 1000);
  return b.build();
}

describe('NetIndex.driverLoads', () => {
  it('sorts the loads of a line by kind, with each base transistor and pull-up', () => {
    const nl = design();
    const idx = new NetIndex(nl, extractLogic(nl));
    const dev = (name: string) => nl.devices.findIndex((d) => d.name === name);
    const loads = idx.driverLoads(nl.netByName.get('LDN')!);
    expect(loads.resistorBases).toEqual([
      { resistor: dev('RBL1'), ohms: 3300, transistor: dev('QL1'), collectorPullUp: 2200 },
      { resistor: dev('RBL2'), ohms: 6800, transistor: dev('QL2'), collectorPullUp: 4700 },
    ]);
    expect(loads.diodeInputs).toEqual([{ diode: dev('DIN'), pullUpOhms: 3900 }]);
    expect(loads.direct).toBe(1);
    expect(loads.total).toBe(4);
  });

  it('gives the same loads however many terminals the supply rail carries', () => {
    const small = design();
    const big = design(3000);
    const a = new NetIndex(small, extractLogic(small)).driverLoads(small.netByName.get('LDN')!);
    const b = new NetIndex(big, extractLogic(big)).driverLoads(big.netByName.get('LDN')!);
    expect(b).toEqual(a);
  });

  it('merges loads of several lines and finds their equivalent base resistor', () => {
    const nl = design();
    const idx = new NetIndex(nl, extractLogic(nl));
    const one = idx.driverLoads(nl.netByName.get('LDN')!);
    const two = mergeDriverLoads([one, one]);
    expect(two.total).toBe(8);
    expect(two.resistorBases).toHaveLength(4);
    // N / Σ 1/R_B (circuit law: N equal resistors in parallel)
    expect(equivalentBaseResistor(two.resistorBases)).toBeCloseTo(4 / (2 / 3300 + 2 / 6800), 9);
  });
});

describe('NetIndex.of', () => {
  it('shares its tables per frozen design and view, and builds afresh while they may change', () => {
    const nl = design();
    const view = extractLogic(nl);
    expect(NetIndex.of(nl, view).ownerOf).not.toBe(NetIndex.of(nl, view).ownerOf);
    deepFreeze(nl);
    deepFreeze(view);
    const first = NetIndex.of(nl, view);
    expect(new NetIndex(nl, view).ownerOf).toBe(first.ownerOf);
    const other = extractLogic(nl);
    deepFreeze(other);
    expect(NetIndex.of(nl, other).ownerOf).not.toBe(first.ownerOf);
    // a shared index answers like a fresh one
    const fresh = design();
    const freshLoads = new NetIndex(fresh, extractLogic(fresh)).driverLoads(fresh.netByName.get('LDN')!);
    expect(new NetIndex(nl, view).driverLoads(nl.netByName.get('LDN')!)).toEqual(freshLoads);
  });
});
