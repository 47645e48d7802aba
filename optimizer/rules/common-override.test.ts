// common-override: valid cases (no finding) and invalid ones (message id, data, part delta), DTL
// and RTL receivers, the split into the fewest common overrides, contention with a normal driver
// pulling high (with and without the assumption that rules it out), hierarchy, the doc examples.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { exprToString } from '../logic/expr';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { commonOverride } from './common-override';
import { scan } from './scan';
import { assumption, checkDeckExample, countDelta, deckExamples, deckNetlist, runOne } from './support/rule-test-kit';
import type { Rule } from './types';

const rule = commonOverride as unknown as Rule;

interface Bits {
  rc?: number;
  rclr?: number;
  /** Receiving stage of each line: DTL NAND input, RTL inverter, or none. */
  receiver?: 'dtl' | 'rtl' | 'none';
  /** Control of bit k's override (default CLR for all). */
  control?: (k: number) => string;
  /** Leave out the normal driver (the line is then a plain inverter of the control). */
  noDriver?: boolean;
  /** Add a PMOS from VCC to the line, on while LDN is low (a normal driver pulling high). */
  activeHigh?: boolean;
  slice?: string;
}

/**
 * Per bit k (instance XB<k>): line Y pulled up by RC, normal driver QD (base from Dk), override
 * QK (base from CLR through RK), and a receiver reading Y.
 *
 *   VCC ─RC─ Y ─┬─ QD(Dk) ─ 0        receiver: DTL  Y ◄DI─ P ─DL1─DL2─ QR(Z)   or   RTL  Y ─RR─ QR(Z)
 *               └─ QK(CLR) ─ 0
 */
function bits(n: number, o: Bits = {}): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 register clear lines');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  if (o.receiver === 'dtl') b.model('DN', 'd', { IS: 1e-14 });
  if (o.activeHigh) b.model('PM', 'pmos', { VTO: -1, KP: 2e-5 });
  for (let k = 0; k < n; k++) {
    b.within([`${o.slice ?? 'XB'}${k}`], () => {
      b.resistor('RC', 'VCC', 'Y', o.rc ?? 1000);
      if (!o.noDriver) {
        b.resistor('RD', `/D${k}`, 'BD', 4700);
        b.npn('QD', 'Y', 'BD', '0', { model: 'QN' });
      }
      b.resistor('RK', `/${o.control ? o.control(k) : 'CLR'}`, 'BK', o.rclr ?? 4700);
      b.npn('QK', 'Y', 'BK', '0', { model: 'QN' });
      if (o.activeHigh) b.pmos('MP', 'Y', '/LDN', 'VCC', { model: 'PM', bulk: 'VCC' });
      if (o.receiver === 'dtl') {
        b.resistor('RP', 'VCC', 'P', 4700);
        b.diode('DI', 'P', 'Y', { model: 'DN' });
        b.diode('DL1', 'P', 'M', { model: 'DN' });
        b.diode('DL2', 'M', 'BR', { model: 'DN' });
        b.resistor('RBL', 'BR', '0', 5000);
        b.resistor('RZ', 'VCC', 'Z', 2000);
        b.npn('QR', 'Z', 'BR', '0', { model: 'QN' });
      } else if (o.receiver !== 'none') {
        b.resistor('RR', 'Y', 'BR', 4700);
        b.resistor('RZ', 'VCC', 'Z', 1000);
        b.npn('QR', 'Z', 'BR', '0', { model: 'QN' });
      }
    });
  }
  return b.build();
}

describe('common-override: valid (no finding)', () => {
  it.each([
    ['one line only', bits(1, { receiver: 'dtl' })],
    ['every line cleared by its own control', bits(4, { receiver: 'dtl', control: (k) => `CLR${k}` })],
    ['lines with no normal driver (plain inverters of CLR)', bits(3, { receiver: 'dtl', noDriver: true })],
  ])('%s', async (_l, nl) => {
    const r = await runOne(rule, nl);
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

describe('common-override: invalid (findings)', () => {
  it('four lines read by DTL inputs share one override through steering diodes, same functions, stated savings', async () => {
    const nl = bits(4, { receiver: 'dtl' });
    const r = await runOne(rule, nl);
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data).toMatchObject({ count: 4, control: 'CLR', drivers: 1, diodes: 4 });
    expect(f.data.where).toBe('bit 0 of slice XB0, bit 1 of slice XB1, bit 2 of slice XB2, bit 3 of slice XB3');
    const p = f.proposals[0];
    expect(p.edit.removeDevices).toEqual(['XB1.QK', 'XB1.RK', 'XB2.QK', 'XB2.RK', 'XB3.QK', 'XB3.RK']);
    expect(p.edit.reconnect).toEqual([{ device: 'XB0.QK', terminal: 0, net: 'CLR_OVR' }]);
    expect(p.edit.addDevices.map((d) => [d.name, d.terminals, d.model])).toEqual([0, 1, 2, 3].map((k) => [`XB${k}.DOVR`, [`XB${k}.Y`, 'CLR_OVR'], 'DN']));
    expect(p.edit.addModels).toBeUndefined(); // the design's own diode model is used
    expect(p.margins.map((m) => [m.name, m.status])).toEqual([
      ['sink current', 'pass'],
      ['forced β', 'warn'],
      ['diode-steered low level', 'pass'],
      ['contention', 'pass'],
      ['back-feed between lines', 'pass'],
    ]);
    expect(p.assumptions).toEqual([]);
    // N−1 transistors and N−1 base resistors saved, N diodes added (the rule's stated trade).
    const d = countDelta(nl, p);
    expect(d.actual).toEqual({ transistors: 3, resistors: 3, diodes: -4 });
    expect(d.actual).toEqual(d.stated);
    const after = extractLogic(applyProposals(nl, [p]));
    for (let k = 0; k < 4; k++) expect(exprToString(after.nodes.find((n) => n.name === `XB${k}.Y`)!.fn)).toBe(`!(D${k} | CLR)`);
  });

  it('the scan proves the rewrite and marks it ready', async () => {
    const nl = bits(3, { receiver: 'dtl' });
    const s = await scan(nl, { rules: { [rule.id]: rule } });
    expect(s.findings).toHaveLength(1);
    const sp = s.findings[0].proposals[0];
    expect(sp.verification.status).toBe('proved');
    expect(sp.verification.simulatedVectors).toBeGreaterThan(0);
    expect(sp.verdict).toBe('ready');
    expect(sp.savings).toMatchObject({ transistors: 2, resistors: 2, diodes: -3 });
  });

  it('lines read by plain RTL inputs: the steered low level (V_CE(sat) + V_D) fails their threshold', async () => {
    const nl = bits(4, { receiver: 'rtl' });
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('failing');
    const low = f.proposals[0].margins.find((m) => m.name === 'diode-steered low level')!;
    // 0.3 V + 0.75 V worst case against RTL V_IL 0.5 V (common practice; margin defaults)
    expect(low.value).toBeCloseTo(1.05, 5);
    expect(low.limit).toBe(0.5);
    expect(low.status).toBe('fail');
    expect(f.data.failed).toBe('diode-steered low level');
    const s = await scan(nl, { rules: { [rule.id]: rule } });
    expect(s.findings[0].proposals[0].verdict).toBe('failing-margins');
  });

  it('designs without a diode model get a generic one with the proposal', async () => {
    const nl = bits(2, { receiver: 'none' });
    const p = (await runOne(rule, nl)).findings[0].proposals[0];
    expect(p.edit.addModels).toEqual([{ name: 'DSTEER', type: 'd', params: { IS: 1e-14 } }]);
    expect(p.edit.addDevices.every((d) => d.model === 'DSTEER')).toBe(true);
    expect(applyProposals(nl, [p]).models.dsteer?.type).toBe('d');
  });

  it('eight slices XSLICE0..7 with weak base drive split into the fewest overrides that keep forced β', async () => {
    // 8 lines × (5.25 − 0.2 − 0.7) V / 950 Ω ≈ 37 mA from one override fed through 10k: forced β
    // ≈ 97 > β_min 50 (BF 100 derated) fails; two overrides of four lines each give ≈ 48 (warn).
    const nl = bits(8, { receiver: 'dtl', rclr: 10000, slice: 'XSLICE' });
    const f = (await runOne(rule, nl)).findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data.drivers).toBe(2);
    expect(f.data.where).toBe('bit 0 of slice XSLICE0, bit 1 of slice XSLICE1, bit 2 of slice XSLICE2, bit 3 of slice XSLICE3, … (8 places)');
    expect(f.location.instances).toEqual([0, 1, 2, 3, 4, 5, 6, 7].map((k) => `XSLICE${k}`));
    const p = f.proposals[0];
    expect(p.margins.find((m) => m.name === 'forced β')!.status).toBe('warn');
    expect(p.edit.reconnect.map((r) => r.device)).toEqual(['XSLICE0.QK', 'XSLICE4.QK']);
    const d = countDelta(nl, p);
    expect(d.actual).toEqual({ transistors: 6, resistors: 6, diodes: -8 });
    expect(d.actual).toEqual(d.stated);
  });

  it('reports contention with a normal driver pulling high, unless an assumption rules it out', async () => {
    // MP pulls each line high while LDN is low; with CLR high the common override fights it.
    const nl = bits(2, { receiver: 'dtl', activeHigh: true });
    const without = (await runOne(rule, nl)).findings[0];
    expect(without.messageId).toBe('failing');
    const fight = without.proposals[0].margins.find((m) => m.name === 'contention')!;
    expect(fight.status).toBe('fail');
    expect(fight.note).toContain('CLR=1');
    expect(fight.note).toContain('LDN=0');
    const withA = (await runOne(rule, nl, { assumptions: [assumption('A1', '!(CLR & !LDN)')] })).findings[0];

    expect(withA.messageId).toBe('share');
    expect(withA.proposals[0].assumptions).toEqual(['A1']);
    expect(withA.proposals[0].margins.find((m) => m.name === 'contention')!.status).toBe('pass');
  });

  it('checks contention and back-feed per group of lines when the lines have more inputs than the exhaustive limit', async () => {
    // Six lines read CLR, LDN and D0…D5 (8 inputs): above a limit of 5 each pair of lines is
    // simulated with the kept override, exhaustively (a pair and its override read at most 5).
    const nl = bits(6, { receiver: 'dtl', activeHigh: true });
    const options = { minCopies: 2, sneakExhaustiveLimit: 5 };
    const without = (await runOne(rule, nl, { options })).findings[0];
    const fight = without.proposals[0].margins.find((m) => m.name === 'contention')!;
    expect(fight.status).toBe('fail');
    expect(fight.note).toContain('CLR=1');
    expect(fight.note).toContain('LDN=0');
    const withA = (await runOne(rule, nl, { options, assumptions: [assumption('A1', '!(CLR & !LDN)')] })).findings[0];
    expect(withA.proposals[0].assumptions).toEqual(['A1']);
    const margins = withA.proposals[0].margins;
    expect(margins.find((m) => m.name === 'contention')!.status).toBe('pass');
    const backFeed = margins.find((m) => m.name === 'back-feed between lines')!;
    expect(backFeed.status).toBe('pass');
    // Three pairs, each exhaustive over at most 2^5 vectors (fewer where A1 rules vectors out).
    expect(backFeed.note).toMatch(/on (\d+) input vectors/);
    const n = Number(/on (\d+) input vectors/.exec(backFeed.note)![1]);
    // More than one whole-region sample of 2^5 could hold: the pairs were simulated apart.
    expect(n).toBeGreaterThan(2 ** 5);
    expect(n).toBeLessThanOrEqual(3 * 2 ** 5);
  });
});

describe('common-override: doc examples', () => {
  const examples = deckExamples(path.join(__dirname, 'common-override.md'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(3));
  it.each(examples.map((e) => [e.label, e] as const))('%s', (_l, ex) => checkDeckExample(rule, ex));
});
