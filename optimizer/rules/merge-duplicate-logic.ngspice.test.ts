// ngspice (Debian package) on the Wren-8 strobe slices: after merging the per-slice strobe
// inverters the outputs keep their logic levels for both strobe values, and the shared driver's
// loaded high level agrees with ngspice's operating point within 15 %. Generic NPN IS=1e-14
// BF=100; RTL thresholds V_IL 0.5 V, V_IH 1.0 V (common practice).
import { describe, expect, it } from 'vitest';
import { marginSettings } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import { allCombinations, levelOf, operatingPoints } from '@/tests/support/ngspice';
import { mergeDuplicateLogic } from './merge-duplicate-logic';
import { applied, deckOf, scanOne } from './support/rule-test-kit';

const level = (v: number) => levelOf(v, 0.5, 1.0);

describe('merge-duplicate-logic in ngspice', () => {
  it('merged strobe inverter: same levels, loaded high level within 15 %', async () => {
    const b = new NetlistBuilder('Wren-8 strobe').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
    for (let k = 0; k < 4; k++) {
      b.within([`XS${k}`], () => {
        b.resistor('RB', '/LOAD', 'B', 4700).npn('Q1', 'LDN', 'B', '0').resistor('RC', 'VCC', 'LDN', 1000);
        b.resistor('RL', 'LDN', 'BL', 4700).npn('QL', `/Y${k}`, 'BL', '0');
        b.resistor('RD', `/D${k}`, 'BD', 4700).npn('QD', `/Y${k}`, 'BD', '0').resistor('RY', 'VCC', `/Y${k}`, 1000);
      });
    }
    const nl = b.build();
    const s = await scanOne(mergeDuplicateLogic, nl, { margins: marginSettings({ supplyTolerance: 0, resistorTolerance: 0 }) });
    const sp = s.findings[0].proposals[0];
    expect(sp.verdict).toBe('ready');
    const combos = allCombinations(['LOAD', 'D0', 'D1', 'D2', 'D3'], 0, 5);
    const outs = ['Y0', 'Y1', 'Y2', 'Y3'];
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: outs });
    const after = operatingPoints(deckOf(applied(nl, sp.proposal)), { combinations: combos, probe: [...outs, 'XS0.LDN'] });
    combos.forEach((c, i) => {
      for (const o of outs) expect(level(after[i][o]), `${o} @ ${JSON.stringify(c)}`).toBe(level(before[i][o]));
    });
    const high = after[combos.findIndex((c) => c.LOAD === 0)]['XS0.LDN'];
    const margin = sp.margins.find((m) => m.name === 'loaded high level')!;
    expect(Math.abs(margin.value - high) / high).toBeLessThan(0.15); // ngspice operating point
  });
});
