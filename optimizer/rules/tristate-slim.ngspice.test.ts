// ngspice (Debian package) on a two-slice CMOS bus: the open-drain rewrite with its chosen
// pull-up gives the same level at the bus reader on every combination the one-hot assumption
// allows while some stage drives (an idle tri-state line floats), and the static power margin
// agrees with ngspice's operating point within 15 %. Generic MOS level 1 models (KP 2 mA/V² for
// the output devices, a small-signal switching MOSFET); CMOS thresholds 30 %/70 % of V_DD
// (common practice).
import { describe, expect, it } from 'vitest';
import { marginSettings } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import { allCombinations, levelOf, operatingPoints } from '@/tests/support/ngspice';
import { applied, deckOf, runOne } from './support/rule-test-kit';
import { tristateSlim } from './tristate-slim';

describe('tristate-slim in ngspice', () => {
  it('open-drain bus: same reader levels wherever one stage drives; static power within 15 %', async () => {
    const b = new NetlistBuilder('Wren-8 data bus').rail('VDD', 5).model('NM', 'nmos', { LEVEL: 1, VTO: 0.7, KP: 2e-3 }).model('PM', 'pmos', { LEVEL: 1, VTO: -0.7, KP: 1e-3 });
    for (let k = 0; k < 2; k++) {
      b.within([`XB${k}`], () => {
        b.pmos('PI', 'ENB', `/EN${k}`, 'VDD', { bulk: 'VDD' }).nmos('NI', 'ENB', `/EN${k}`, '0');
        b.pmos('P1', 'M1', `/D${k}`, 'VDD', { bulk: 'VDD' }).pmos('P2', '/BUS', 'ENB', 'M1', { bulk: 'VDD' });
        b.nmos('N2', '/BUS', `/EN${k}`, 'M2').nmos('N1', 'M2', `/D${k}`, '0');
      });
    }
    b.pmos('PR', 'Q', 'BUS', 'VDD', { bulk: 'VDD' }).nmos('NR', 'Q', 'BUS', '0');
    const nl = b.build();
    const r = await runOne(tristateSlim, nl, { assumptions: ['!(EN0 & EN1)'], margins: marginSettings({ supplyTolerance: 0, resistorTolerance: 0 }) });
    const p = r.findings[0].proposals[0];
    expect(p.margins.every((m) => m.status !== 'fail')).toBe(true);
    const combos = allCombinations(['EN0', 'EN1', 'D0', 'D1'], 0, 5).filter((c) => (c.EN0 > 0) !== (c.EN1 > 0)); // one-hot and driving
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: ['Q', 'BUS'] });
    const after = operatingPoints(deckOf(applied(nl, p)), { combinations: combos, probe: ['Q', 'BUS'] });
    combos.forEach((c, i) => {
      expect(levelOf(after[i].Q, 1.5, 3.5), JSON.stringify(c)).toBe(levelOf(before[i].Q, 1.5, 3.5));
      expect(levelOf(after[i].BUS, 1.5, 3.5), JSON.stringify(c)).toBe(levelOf(before[i].BUS, 1.5, 3.5));
    });
    // bus held low by stage 0 (EN0 = 1, D0 = 1): power in the pull-up
    const low = after[combos.findIndex((c) => c.EN0 > 0 && c.D0 > 0)].BUS;
    const r0 = p.edit.addDevices.find((d) => d.kind === 'resistor')!.value!;
    const measured = (5 - low) ** 2 / r0;
    const margin = p.margins.find((m) => m.name === 'static power')!;
    expect(Math.abs(margin.value - measured) / measured).toBeLessThan(0.15); // ngspice operating point
  });
});
