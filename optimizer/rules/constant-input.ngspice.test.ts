// ngspice (Debian package) on small decks: a CMOS NAND-3 with a strapped input and an RTL NOR
// whose test input the assumptions hold low keep their logic levels after the rewrite on every
// input combination the assumptions allow; the RTL output's loaded high level agrees with
// ngspice within 15 %. Generic models: NPN IS=1e-14 BF=100, MOS level 1. Thresholds: CMOS 30 %/70 %
// of V_DD, RTL 0.5 V/1.0 V (common practice).
import { describe, expect, it } from 'vitest';
import { marginSettings } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import { allCombinations, levelOf, operatingPoints } from '@/tests/support/ngspice';
import { constantInput } from './constant-input';
import { applied, deckOf, scanOne } from './support/rule-test-kit';

describe('constant-input in ngspice', () => {
  it('CMOS NAND-3 with an input on V_DD: same levels as the NAND-2 it becomes', async () => {
    const b = new NetlistBuilder('Wren-8 decode').rail('VDD', 5).model('NM', 'nmos', { LEVEL: 1, VTO: 0.7, KP: 110e-6 }).model('PM', 'pmos', { LEVEL: 1, VTO: -0.7, KP: 50e-6 });
    ['A', 'B', 'VDD'].forEach((a, i) => b.pmos(`P${i}`, 'Y', a, 'VDD', { bulk: 'VDD' }));
    b.nmos('N0', 'Y', 'A', 'M1').nmos('N1', 'M1', 'B', 'M2').nmos('N2', 'M2', 'VDD', '0');
    const nl = b.build();
    const s = await scanOne(constantInput, nl);
    const sp = s.findings[0].proposals[0];
    expect(sp.verdict).toBe('ready');
    const combos = allCombinations(['A', 'B'], 0, 5);
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: ['Y'] });
    const after = operatingPoints(deckOf(applied(nl, sp.proposal)), { combinations: combos, probe: ['Y'] });
    combos.forEach((c, i) => {
      expect(levelOf(after[i].Y, 1.5, 3.5), JSON.stringify(c)).toBe(levelOf(before[i].Y, 1.5, 3.5));
      expect(levelOf(after[i].Y, 1.5, 3.5)).not.toBe('X');
    });
  });

  it('RTL NOR with TEST held low: same levels where TEST = 0; loaded high level within 15 %', async () => {
    const b = new NetlistBuilder('Wren-8 status').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
    b.resistor('RC', 'VCC', 'Y', 1000);
    for (const a of ['A', 'TEST']) b.resistor(`R${a}`, a, `B${a}`, 4700).npn(`Q${a}`, 'Y', `B${a}`, '0');
    for (let k = 0; k < 3; k++) b.resistor(`RL${k}`, 'Y', `BL${k}`, 4700).npn(`QL${k}`, `Z${k}`, `BL${k}`, '0').resistor(`RZ${k}`, 'VCC', `Z${k}`, 1000);
    const nl = b.build();
    const s = await scanOne(constantInput, nl, { assumptions: ['!TEST'], margins: marginSettings({ supplyTolerance: 0, resistorTolerance: 0 }) });
    const sp = s.findings[0].proposals[0];
    expect(sp.verdict).toBe('ready');
    expect(sp.verification.assumptions).toEqual(['A1']);
    const combos = [{ A: 0, TEST: 0 }, { A: 5, TEST: 0 }]; // what !TEST allows
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: ['Y', 'Z0'] });
    const afterNl = applied(nl, sp.proposal);
    const after = operatingPoints(deckOf(afterNl), { combinations: [{ A: 0 }, { A: 5 }], probe: ['Y', 'Z0'] });
    combos.forEach((c, i) => {
      for (const p of ['Y', 'Z0']) expect(levelOf(after[i][p], 0.5, 1.0), `${p} ${JSON.stringify(c)}`).toBe(levelOf(before[i][p], 0.5, 1.0));
    });
    const margin = sp.margins.find((m) => m.name === 'loaded high level')!;
    expect(Math.abs(margin.value - after[0].Y) / after[0].Y).toBeLessThan(0.15); // ngspice operating point
  });
});
