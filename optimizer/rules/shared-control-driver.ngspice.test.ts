// ngspice (Debian package, generic textbook models: NPN IS=1e-14 BF=100) against
// shared-control-driver: the applied rewrite gives the original's logic levels on every input
// combination, its loaded-high-level and load-base-current figures agree with the operating point
// at the same corner within 15 %, and the rewrite the rule marks failing really breaks the levels.
import { describe, expect, it } from 'vitest';
import { DEFAULT_MARGIN_SETTINGS as S } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { operatingPoints } from '@/tests/support/ngspice';
import { applied, atCorner, deckOf, levelTable, relativeDiff } from '@/tests/support/rule-levels';
import { sharedControlDriver } from './shared-control-driver';
import { runOne } from './support/rule-test-kit';
import type { Rule } from './types';

const rule = sharedControlDriver as unknown as Rule;
// RTL input thresholds V_IL 0.5 V, V_IH 1.0 V (common practice; the margin defaults).
const RTL = S.thresholds.rtl;

/** Slices: an RTL inverter of the shared LOAD strobe, its output LDN feeding `loads` RTL stages on D. */
function slices(n: number, loads: number, rc: number, rbl: number, rl: number): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 load strobe slices');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  for (let k = 0; k < n; k++) {
    b.within([`XS${k}`], () => {
      b.resistor('RC', 'VCC', 'LDN', rc);
      b.resistor('RB', '/LOAD', 'B', 4700);
      b.npn('Q1', 'LDN', 'B', '0');
      for (let j = 0; j < loads; j++) {
        b.resistor(`RBL${j}`, 'LDN', `BL${j}`, rbl);
        b.npn(`QL${j}`, `OUT${j}`, `BL${j}`, '0');
        b.resistor(`RL${j}`, 'VCC', `OUT${j}`, rl);
      }
    });
  }
  return b.build();
}

const outs = (n: number, loads: number) => Array.from({ length: n }, (_, k) => Array.from({ length: loads }, (_, j) => `XS${k}.OUT${j}`)).flat();

describe('shared-control-driver in ngspice', () => {
  it('a ready rewrite keeps every logic level, and its margins match the operating point within 15 %', async () => {
    const nl = slices(8, 1, 1000, 4700, 4700);
    const f = (await runOne(rule, nl)).findings[0];
    const p = f.proposals[0];
    expect(p.margins.every((m) => m.status !== 'fail')).toBe(true);
    const nets = [...outs(8, 1), 'XS0.LDN', 'XS4.LDN'];
    const before = levelTable(nl, { inputs: ['LOAD'], nets, high: 5, thresholds: RTL });
    const after = levelTable(applied(nl, p), { inputs: ['LOAD'], nets, high: 5, thresholds: RTL });
    expect(before.levels.flatMap(Object.values)).not.toContain('X');
    expect(after.levels).toEqual(before.levels);

    // The loaded high level at the rule's own corner (LOAD low: the shared driver off).
    const high = p.margins.find((m) => m.name === 'loaded high level')!;
    const rewritten = applied(nl, p);
    const loadResistors = [0, 1, 2, 3].map((k) => `XS${k}.RBL0`);
    const corner = atCorner(rewritten, high.corner, { R_C: ['XS0.RC'], R_B: loadResistors });
    const [row] = operatingPoints(deckOf(corner), { combinations: [{ LOAD: 0 }], probe: ['XS0.LDN', 'XS0.BL0'] });
    expect(relativeDiff(high.value, row['XS0.LDN'])).toBeLessThan(0.15);

    const base = p.margins.find((m) => m.name === 'load base current')!;
    const atBase = atCorner(rewritten, base.corner, { R_C: ['XS0.RC'], R_B: loadResistors });
    const [r2] = operatingPoints(deckOf(atBase), { combinations: [{ LOAD: 0 }], probe: ['XS0.LDN', 'XS0.BL0'] });
    const rb = 4700 * (base.corner.resistors.includes('R_B +') ? 1.05 : 0.95);
    const ib = (r2['XS0.LDN'] - r2['XS0.BL0']) / rb;
    expect(relativeDiff(base.value, ib)).toBeLessThan(0.15);
  });

  it('the rewrite marked failing-margins does break the loads in ngspice', async () => {
    // 2.2k pull-up, 2.2k base resistors, 150 Ω load collectors: four loads per driver saturate,
    // eight on one shared driver do not (I_B·β < I_C).
    const nl = slices(2, 4, 2200, 2200, 150);
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('failing');
    const p = f.proposals[0];
    expect(p.margins.filter((m) => m.status === 'fail').map((m) => m.name)).toContain('load base current');
    const nets = outs(2, 4);
    const before = levelTable(nl, { inputs: ['LOAD'], nets, high: 5, thresholds: RTL });
    const after = levelTable(applied(nl, p), { inputs: ['LOAD'], nets, high: 5, thresholds: RTL });
    // LOAD = 0: the strobe line is high and every load should pull its output low.
    expect(Object.values(before.levels[0])).toEqual(Array(8).fill(0));
    expect(Object.values(after.levels[0])).not.toEqual(Array(8).fill(0));
  });
});
