// Small fixtures for rule and rewrite tests: an RTL bit-slice netlist built in code and an empty
// logic view for framework tests that do not depend on extraction.
import type { LogicView } from '../extract/types';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';

/**
 * Four slices of the Wren-8 register file's load gating, each with its own RTL inverter on the
 * shared LOAD strobe:
 *
 *   VCC ─ RC ─┬─ XSk.LDN          (per slice k = 0..3)
 *             Q (base ← RB ← LOAD)
 *   0 ────────┘
 */
export function sliceInverters(slices = 4): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 load strobe inverters');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let k = 0; k < slices; k++) {
    b.within([`XS${k}`], () => {
      b.resistor('RC', 'VCC', 'LDN', 1000);
      b.resistor('RB', '/LOAD', 'B', 4700);
      b.npn('Q1', 'LDN', 'B', '0', { model: 'QN' });
    });
  }
  return b.build();
}

export function emptyView(title = 'test'): LogicView {
  return {
    title,
    nodes: [],
    nodeByNet: new Map(),
    inputs: [],
    stateBits: [],
    rails: new Map(),
    family: 'none',
    familyCounts: {},
    diagnostics: [],
  };
}
