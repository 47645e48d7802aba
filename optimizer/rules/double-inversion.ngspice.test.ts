// ngspice (Debian package; scripts/test.sh installs it) on small RTL decks: the applied rewrite of
// a ready double-inversion finding gives the original's logic levels on every input combination,
// its loaded-high-level margin agrees with ngspice's operating point within 15 %, and a rewrite
// that overloads the line is both marked failing-margins and seen breaking the levels in ngspice;
// a NOR whose other inputs are strapped to 0 V, removed as the second inverter with its tied-off
// parts, keeps its reader's levels.
// Generic textbook model NPN IS=1e-14 BF=100. RTL thresholds V_IL 0.5 V, V_IH 1.0 V (common practice).
import { describe, expect, it } from 'vitest';
import { marginSettings } from '../margins/defaults';
import { NetlistBuilder } from '../netlist/build';
import { allCombinations, levelOf, operatingPoints } from '@/tests/support/ngspice';
import { doubleInversion } from './double-inversion';
import { applied, deckOf, scanOne } from './support/rule-test-kit';

const NOMINAL = marginSettings({ supplyTolerance: 0, resistorTolerance: 0 });
const level = (v: number) => levelOf(v, 0.5, 1.0);

function pairDesign(loads: number, rcDriver: number, rbLoad: number) {
  const b = new NetlistBuilder('Wren-8 double inversion').rail('VCC', 5).model('QN', 'npn', { IS: 1e-14, BF: 100 });
  // S = NOR(A, E) with its own pull-up; X = !S; Y = !X; Y feeds `loads` NOR gates with C
  b.resistor('RA0', 'A', 'BA0', 4700).npn('QA0', 'S', 'BA0', '0').resistor('RE0', 'E', 'BE0', 4700).npn('QE0', 'S', 'BE0', '0').resistor('RC0', 'VCC', 'S', rcDriver);
  b.resistor('RB1', 'S', 'B1', 4700).npn('Q1', 'X', 'B1', '0').resistor('RC1', 'VCC', 'X', 1000);
  b.resistor('RB2', 'X', 'B2', 4700).npn('Q2', 'Y', 'B2', '0').resistor('RC2', 'VCC', 'Y', 1000);
  for (let k = 0; k < loads; k++) {
    b.resistor(`RL${k}`, 'Y', `BL${k}`, rbLoad).npn(`QL${k}`, `Z${k}`, `BL${k}`, '0');
    b.resistor(`RK${k}`, 'C', `BK${k}`, rbLoad).npn(`QK${k}`, `Z${k}`, `BK${k}`, '0').resistor(`RZ${k}`, 'VCC', `Z${k}`, 1000);
  }
  return b.build();
}

describe('double-inversion in ngspice', () => {
  it('ready rewrite: same logic levels on every input combination; loaded high level within 15 %', async () => {
    const nl = pairDesign(2, 1000, 4700);
    const s = await scanOne(doubleInversion, nl, { margins: NOMINAL });
    const sp = s.findings[0].proposals[0];
    expect(sp.verdict).toBe('ready');
    const probes = ['S', 'Z0', 'Z1'];
    const combos = allCombinations(['A', 'E', 'C'], 0, 5);
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: probes });
    const after = operatingPoints(deckOf(applied(nl, sp.proposal)), { combinations: combos, probe: probes });
    combos.forEach((_, i) => {
      for (const p of ['Z0', 'Z1']) {
        expect(level(after[i][p]), `${p} @ ${JSON.stringify(combos[i])}`).toBe(level(before[i][p]));
        expect(level(after[i][p])).not.toBe('X');
      }
    });
    // A = E = 0: S is high and now drives the two load bases directly
    const high = after[combos.findIndex((c) => c.A === 0 && c.E === 0)].S;
    const margin = sp.margins.find((m) => m.name === 'loaded high level')!;
    expect(Math.abs(margin.value - high) / high).toBeLessThan(0.15); // ngspice operating point
  });

  it('overloading rewrite: failing margins, and ngspice shows the line falling below V_IH', async () => {
    const nl = pairDesign(6, 4700, 1000);
    const s = await scanOne(doubleInversion, nl, { margins: NOMINAL });
    const sp = s.findings[0].proposals[0];
    expect(sp.verdict).toBe('failing-margins');
    const margin = sp.margins.find((m) => m.name === 'loaded high level')!;
    expect(margin.status).toBe('fail');
    const combos = [{ A: 0, E: 0, C: 0 }];
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: ['Y'] });
    const after = operatingPoints(deckOf(applied(nl, sp.proposal)), { combinations: combos, probe: ['S'] });
    expect(level(before[0].Y)).toBe(1);
    expect(level(after[0].S)).not.toBe(1); // the loads' line is no longer a valid high
    expect(Math.abs(margin.value - after[0].S) / after[0].S).toBeLessThan(0.15);
  });
});

describe('double-inversion on a NOR with strapped inputs, in ngspice', () => {
  it('QEN and the NOR (with QD, QCLR) go; the reader of Q keeps its levels for both values of LD', async () => {
    // Q = NOR(D = 0 V, ENB, CLR = 0 V) = !ENB = LD, read by an RTL inverter Z = !Q.
    const b = new NetlistBuilder('Wren-8 register bit, data and clear strapped').rail('VCC', 3.6).rail('D', 0).rail('CLR', 0).model('QN', 'npn', { IS: 1e-14, BF: 100 });
    b.resistor('RBEN', 'LD', 'BEN', 470).npn('QEN', 'ENB', 'BEN', '0', { model: 'QN' }).resistor('RCEN', 'VCC', 'ENB', 640);
    b.resistor('RBD', 'D', 'BD', 470).npn('QD', 'Q', 'BD', '0', { model: 'QN' });
    b.resistor('RBE', 'ENB', 'BE', 470).npn('QE', 'Q', 'BE', '0', { model: 'QN' });
    b.resistor('RBC', 'CLR', 'BC', 1000).npn('QCLR', 'Q', 'BC', '0', { model: 'QN' }).resistor('RCQ', 'VCC', 'Q', 640);
    b.resistor('RR', 'Q', 'BR', 4700).npn('QR', 'Z', 'BR', '0', { model: 'QN' }).resistor('RZ', 'VCC', 'Z', 1000);
    const nl = b.build();
    const s = await scanOne(doubleInversion, nl);
    const sp = s.findings[0].proposals[0];
    expect(s.findings[0].finding.messageId).toBe('pairTied');
    expect(sp.verification.status).toBe('proved');
    expect(sp.proposal.edit.removeDevices).toEqual(expect.arrayContaining(['QD', 'RBD', 'QCLR', 'RBC', 'QE', 'QEN']));
    const combos = allCombinations(['LD'], 0, 3.6);
    const before = operatingPoints(deckOf(nl), { combinations: combos, probe: ['Z'] });
    const after = operatingPoints(deckOf(applied(nl, sp.proposal)), { combinations: combos, probe: ['Z'] });
    combos.forEach((c, i) => {
      expect(level(before[i].Z)).toBe(c.LD ? 0 : 1);
      expect(level(after[i].Z), `Z @ LD=${c.LD}`).toBe(level(before[i].Z));
    });
  });
});
