// common-override: valid cases (no finding) and invalid ones (message id, data, part delta), DTL
// and RTL receivers, the split into the fewest common overrides, contention with a normal driver
// pulling high (with and without the assumption that rules it out), hierarchy, the doc examples,
// and the scan's verdict on the register slice whose rail-tied data fold its lines' functions.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../extract';
import { exprToString } from '../logic/expr';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { applyProposals } from '../rewrite/apply';
import { commonOverride } from './common-override';
import { dtlReader, tiedRegister } from './common-override.fixtures';
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
        dtlReader(b);
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

const SHARED = { sharedNode: true };
const MOS = { mosLines: true };

interface SharedBits {
  /** How the lines share a node: their pull-ups hang from S, or each line has a diode onto ANY. */
  via: 'pull-up' | 'diode';
  receiver: 'dtl' | 'rtl';
  rc?: number;
  /** DTL receivers' diode-node pull-up. */
  rp?: number;
  /** Something else reads the shared pull-up node (a base resistor from S). */
  nodeReader?: boolean;
  flat?: boolean;
}

/**
 * Per bit k: line Y with its normal driver QD and override QK (base from CLR); either Y's pull-up
 * RC hangs from S (S pulled up by RS from VCC), or Y has its own pull-up and a diode DZ onto ANY
 * (pulled down by RANY: "some bit is high"). Slices XB<k>, or written flat with suffixes.
 */
function sharedBits(n: number, o: SharedBits): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 status bits');
  b.rail('VCC', 5);
  b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
  b.model('DN', 'd', { IS: 1e-14 });
  if (o.via === 'pull-up') b.resistor('RS', 'VCC', 'S', 100);
  else b.resistor('RANY', 'ANY', '0', 10000);
  if (o.nodeReader) {
    b.resistor('RSB', 'S', 'SB', 4700);
    b.resistor('RSZ', 'VCC', 'SZ', 1000);
    b.npn('QS', 'SZ', 'SB', '0', { model: 'QN' });
  }
  for (let k = 0; k < n; k++) {
    const body = (x: (local: string) => string) => {
      b.resistor(x('RC'), o.via === 'pull-up' ? '/S' : 'VCC', x('Y'), o.rc ?? 1000);
      if (o.via === 'diode') b.diode(x('DZ'), x('Y'), '/ANY', { model: 'DN' });
      b.resistor(x('RD'), `/D${k}`, x('BD'), 4700);
      b.npn(x('QD'), x('Y'), x('BD'), '0', { model: 'QN' });
      b.resistor(x('RK'), '/CLR', x('BK'), 2200);
      b.npn(x('QK'), x('Y'), x('BK'), '0', { model: 'QN' });
      if (o.receiver === 'dtl') {
        b.resistor(x('RP'), 'VCC', x('P'), o.rp ?? 4700);
        b.diode(x('DI'), x('P'), x('Y'), { model: 'DN' });
        b.diode(x('DL1'), x('P'), x('M'), { model: 'DN' });
        b.diode(x('DL2'), x('M'), x('BR'), { model: 'DN' });
        b.resistor(x('RBL'), x('BR'), '0', 5000);
      } else b.resistor(x('RR'), x('Y'), x('BR'), 4700);
      b.resistor(x('RZ'), 'VCC', x('Z'), 2000);
      b.npn(x('QR'), x('Z'), x('BR'), '0', { model: 'QN' });
    };
    if (o.flat) body((l) => `${l}${k}`);
    else b.within([`XB${k}`], () => body((l) => l));
  }
  return b.build();
}

describe('common-override: register slice with rail-tied data and a pulsed clear', () => {
  it('the steered clear is proved (the diodes give the same logic) and refused on its low level only', async () => {
    const nl = deckNetlist(tiedRegister());
    const s = await scan(nl, { rules: { [rule.id]: rule }, assumptions: [assumption('A1', '!(CLR & LD)')] });
    expect(s.ruleErrors).toEqual([]);
    expect(s.findings).toHaveLength(1);
    const { finding: f, proposals } = s.findings[0];
    expect(f.messageId).toBe('failing');
    expect(f.data).toMatchObject({ count: 4, control: 'CLR', failed: 'diode-steered low level' });
    const sp = proposals[0];
    expect(sp.proposal.edit.removeDevices).toEqual(['XB1.QCLR', 'XB1.RBC', 'XB2.QCLR', 'XB2.RBC', 'XB3.QCLR', 'XB3.RBC']);
    expect(sp.proposal.edit.addDevices.map((d) => d.terminals)).toEqual([0, 1, 2, 3].map((k) => [`Q${k}`, 'CLR_OVR']));
    // Every line is compared, and the switch-level check ran on the region with each enable
    // stage still driving its QE (before the region kept them, bits 1 and 3 read a floating ENB).
    expect(sp.verification).toMatchObject({ status: 'proved', method: 'exhaustive' });
    expect(sp.verification.note).toBeUndefined();
    expect(sp.verification.compared).toEqual(expect.arrayContaining(['Q0', 'Q1', 'Q2', 'Q3']));
    expect(sp.verification.simulatedVectors).toBeGreaterThan(0);
    // 0.3 V + 0.75 V worst case against the lines' own RTL V_IL 0.5 V (common practice; margin defaults)
    const low = sp.margins.find((m) => m.name === 'diode-steered low level')!;
    expect([low.value, low.limit, low.status]).toEqual([expect.closeTo(1.05, 5), 0.5, 'fail']);
    expect(sp.margins.filter((m) => m.status === 'fail').map((m) => m.name)).toEqual(['diode-steered low level']);
    expect(sp.verdict).toBe('failing-margins');
    const d = countDelta(nl, sp.proposal);
    expect(d.actual).toEqual({ transistors: 3, resistors: 3, diodes: -4 });
    expect(d.actual).toEqual(d.stated);
  });
});

describe('common-override: a node the lines already share', () => {
  it.each([
    ['pull-ups hanging from S, RTL readers, in slices', { via: 'pull-up', receiver: 'rtl' }, 'S'],
    ['pull-ups hanging from S, RTL readers, flat', { via: 'pull-up', receiver: 'rtl', flat: true }, 'S'],
  ] as const)('%s: one override acts on the node, nothing added, every function kept', async (_l, o, node) => {
    const nl = sharedBits(3, o);
    const r = await runOne(rule, nl, { options: SHARED });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe('shareNode');
    expect(f.data).toMatchObject({ count: 3, control: 'CLR', node, via: o.via });
    expect(f.message).toContain('data sheets');
    const p = f.proposals[0];
    const q = (k: number, d: string) => ('flat' in o && o.flat ? `${d}${k}` : `XB${k}.${d}`);
    expect(p.edit.reconnect).toEqual([{ device: q(0, 'QK'), terminal: 0, net: node }]);
    expect(p.edit.removeDevices).toEqual([q(1, 'QK'), q(1, 'RK'), q(2, 'QK'), q(2, 'RK')]);
    expect(p.edit.addDevices).toEqual([]);
    expect(p.margins.every((m) => m.status !== 'fail')).toBe(true);
    expect(p.margins.map((m) => m.name)).toContain('low level through the shared node');
    // N−1 transistors and N−1 base resistors saved, nothing added.
    const d = countDelta(nl, p);
    expect(d.actual).toEqual({ transistors: 2, resistors: 2, diodes: 0 });
    expect(d.actual).toEqual(d.stated);
  });

  it('is on by default, and switched off only the steering form is looked for', async () => {
    expect((await runOne(rule, sharedBits(3, { via: 'pull-up', receiver: 'rtl' }))).findings.map((f) => f.messageId)).toEqual(['shareNode']);
    const off = { sharedNode: false };
    const r = await runOne(rule, sharedBits(3, { via: 'diode', receiver: 'dtl' }), { options: off });
    expect(r.findings.map((f) => f.messageId)).not.toContain('shareNode');
    expect((await runOne(rule, sharedBits(3, { via: 'pull-up', receiver: 'rtl' }), { options: off })).findings).toEqual([]);
  });

  it('pull-ups hanging from S read by DTL inputs through 10k: the inputs hold the lines above V_IL, refused', async () => {
    // Each DTL input pushes (5 − 0.7 − V)/4.7k through the line's own 10k onto S: the divider
    // (0.3 + 10/4.7·4.3)/(1 + 10/4.7) ≈ 3 V is clamped by the input's own base at V_D + V_BE =
    // 1.4 V, still above DTL V_IL 1.2 V (circuit law; common practice).
    const nl = sharedBits(3, { via: 'pull-up', receiver: 'dtl', rc: 10000 });
    const f = (await runOne(rule, nl, { options: SHARED })).findings[0];
    expect(f.messageId).toBe('failingNode');
    const low = f.proposals[0].margins.find((m) => m.name === 'low level through the shared node')!;
    expect(low.status).toBe('fail');
    expect(low.value).toBeCloseTo(1.4, 5);
    expect(low.limit).toBe(1.2);
    expect(f.data.failed).toBe('low level through the shared node');
  });

  it.each([
    ['in slices', false],
    ['flat', true],
  ])('diodes onto ANY (%s) read by plain RTL inputs: one override on ANY, its diode-steered low level fails, refused', async (_l, flat) => {
    const nl = sharedBits(2, { via: 'diode', receiver: 'rtl', flat });
    const f = (await runOne(rule, nl, { options: SHARED })).findings[0];
    expect(f.messageId).toBe('failingNode');
    expect(f.data).toMatchObject({ node: 'ANY', via: 'diode' });
    const p = f.proposals[0];
    expect(p.edit.addDevices).toEqual([]);
    expect(p.edit.reconnect[0].net).toBe('ANY');
    // The back-feed check watches ANY too: it keeps its value on every vector.
    expect(p.margins.find((m) => m.name === 'back-feed between lines')!.status).toBe('pass');
    expect(p.margins.find((m) => m.name === 'diode-steered low level')!.status).toBe('fail');
    expect(countDelta(nl, p).actual).toEqual({ transistors: 1, resistors: 1, diodes: 0 });
  });

  it('a pull-up node something else reads is not pulled low for the lines: no finding', async () => {
    const r = await runOne(rule, sharedBits(3, { via: 'pull-up', receiver: 'rtl', nodeReader: true }), { options: SHARED });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });
});

interface MosBits {
  load: 'resistor' | 'depletion' | 'pmos';
  receiver: 'cmos' | 'nmos';
  /** Override transistors' width (µm; length 10 µm). */
  w?: number;
  control?: (k: number) => string;
}

/**
 * Per bit k (slice XM<k>): line Y pulled up by a 47k resistor, a depletion NMOS (gate on Y) or a
 * PMOS with its gate grounded; normal driver MD (gate Dk), override MK (gate CLR), and a reader
 * (a CMOS inverter, or an NMOS inverter with a resistor load).
 */
function mosBits(n: number, o: MosBits): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 NMOS register clear');
  b.rail('VDD', 5);
  b.model('NE', 'nmos', { VTO: 0.8, KP: 2e-5 });
  b.model('ND', 'nmos', { VTO: -2, KP: 2e-5 });
  b.model('PE', 'pmos', { VTO: -0.8, KP: 1e-5 });
  for (let k = 0; k < n; k++) {
    b.within([`XM${k}`], () => {
      if (o.load === 'resistor') b.resistor('RL', 'VDD', 'Y', 47000);
      else if (o.load === 'depletion') b.nmos('ML', 'VDD', 'Y', 'Y', { model: 'ND', bulk: '0', params: { W: 10e-6, L: 20e-6 } });
      else b.pmos('ML', 'Y', '0', 'VDD', { model: 'PE', bulk: 'VDD', params: { W: 10e-6, L: 40e-6 } });
      b.nmos('MD', 'Y', `/D${k}`, '0', { model: 'NE', bulk: '0', params: { W: 20e-6, L: 10e-6 } });
      b.nmos('MK', 'Y', `/${o.control ? o.control(k) : 'CLR'}`, '0', { model: 'NE', bulk: '0', params: { W: (o.w ?? 100) * 1e-6, L: 10e-6 } });
      if (o.receiver === 'cmos') b.pmos('MRP', 'Z', 'Y', 'VDD', { model: 'PE', bulk: 'VDD' });
      else b.resistor('RRZ', 'VDD', 'Z', 100000);
      b.nmos('MRN', 'Z', 'Y', '0', { model: 'NE', bulk: '0' });
    });
  }
  return b.build();
}

describe('common-override: NMOS overrides', () => {
  it.each([
    ['resistor pull-ups', 'resistor'],
    ['depletion loads', 'depletion'],
    ['PMOS loads', 'pmos'],
  ] as const)('%s read by CMOS inverters: one NMOS override through steering diodes', async (_l, load) => {
    const nl = mosBits(4, { load, receiver: 'cmos' });
    const r = await runOne(rule, nl, { options: MOS });
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.messageId).toBe('share');
    expect(f.data).toMatchObject({ count: 4, control: 'CLR', drivers: 1, diodes: 4 });
    const p = f.proposals[0];
    expect(p.edit.removeDevices).toEqual(['XM1.MK', 'XM2.MK', 'XM3.MK']);
    expect(p.edit.reconnect).toEqual([{ device: 'XM0.MK', terminal: 0, net: 'CLR_OVR' }]);
    expect(p.margins.map((m) => m.name)).toEqual(['sink current', 'diode-steered low level', 'contention', 'back-feed between lines']);
    expect(p.margins.every((m) => m.status !== 'fail')).toBe(true);
    const low = p.margins.find((m) => m.name === 'diode-steered low level')!;
    // V_DS(on) + V_D,max: above the diode's 0.75 V, below CMOS V_IL (30 % of the corner's supply, common practice).
    expect(low.value).toBeGreaterThan(0.75);
    expect(low.limit).toBeCloseTo(0.3 * low.corner.supply, 5);
    const d = countDelta(nl, p);
    expect(d.actual).toEqual({ transistors: 3, resistors: 0, diodes: -4 });
    expect(d.actual).toEqual(d.stated);
    // Every line keeps its function at switch level: back-feed compares before and after on every vector.
    expect(p.margins.find((m) => m.name === 'back-feed between lines')!.note).toContain('on 32 input vectors');
  });

  it('is on by default, and switched off NMOS lines are left alone', async () => {
    expect((await runOne(rule, mosBits(3, { load: 'resistor', receiver: 'cmos' }))).findings.map((f) => f.messageId)).toEqual(['share']);
    expect((await runOne(rule, mosBits(3, { load: 'resistor', receiver: 'cmos' }), { options: { mosLines: false } })).findings).toEqual([]);
  });

  it('lines read by NMOS inverters (V_IL 0.8 V): the steered low level fails, refused', async () => {
    const f = (await runOne(rule, mosBits(3, { load: 'resistor', receiver: 'nmos' }), { options: MOS })).findings[0];
    expect(f.messageId).toBe('failing');
    const low = f.proposals[0].margins.find((m) => m.name === 'diode-steered low level')!;
    expect(low.status).toBe('fail');
    expect(low.limit).toBe(0.8);
  });

  it('a narrow override cannot hold eight depletion-loaded lines low: its on-resistance fails the low level', async () => {
    // Eight loads of β/2·V_T² = 1e-5·4/2·0.5 = 20 µA each into W/L 0.2 (β 4 µA/V², V_ov 4 V): the
    // channel carries at most β/2·V_ov² = 32 µA, so the common node rises (square law).
    const f = (await runOne(rule, mosBits(8, { load: 'depletion', receiver: 'cmos', w: 2 }), { options: MOS })).findings[0];
    expect(f.messageId).toBe('failing');
    expect(f.proposals[0].margins.find((m) => m.name === 'diode-steered low level')!.status).toBe('fail');
  });

  it('each line cleared by its own control: no finding', async () => {
    const r = await runOne(rule, mosBits(3, { load: 'resistor', receiver: 'cmos', control: (k) => `CLR${k}` }), { options: MOS });
    expect(r.findings).toEqual([]);
  });
});

describe('common-override: doc examples', () => {
  const examples = deckExamples(path.join(__dirname, 'common-override.md'));
  it('has examples', () => expect(examples.length).toBeGreaterThanOrEqual(3));
  it.each(examples.map((e) => [e.label, e] as const))('%s', (_l, ex) => checkDeckExample(rule, ex));
});

describe('common-override: switches that are no override (options on by default)', () => {
  it('an NMOS NOR whose inputs are held at 0 V: no finding (a constant control is no override, one line is not two)', async () => {
    const nl = deckNetlist(
      ['Wren-8 spare NOR-2, inputs strapped low', 'VDD VDD 0 DC 5', 'VA A 0 DC 0', 'VB B 0 DC 0', 'RL VDD Y 20k', 'MA Y A 0 0 NM', 'MB Y B 0 0 NM', '.model NM NMOS (LEVEL=1 VTO=0.7 KP=110u)', '.end', ''].join('\n'),
    );
    const r = await runOne(rule, nl);
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings).toEqual([]);
  });

  it('two paralleled clears on each line count that line once', async () => {
    // Each line has QK and a paralleled QK2 from the same CLR: still two lines, one finding of two.
    const b = new NetlistBuilder('Wren-8 register clear lines, doubled clears');
    b.rail('VCC', 5);
    b.model('QN', 'npn', { IS: 1e-14, BF: 100 });
    b.model('DN', 'd', { IS: 1e-14 });
    for (let k = 0; k < 2; k++) {
      b.within([`XB${k}`], () => {
        b.resistor('RC', 'VCC', 'Y', 1000);
        b.resistor('RD', `/D${k}`, 'BD', 4700);
        b.npn('QD', 'Y', 'BD', '0', { model: 'QN' });
        b.resistor('RK', '/CLR', 'BK', 4700);
        b.npn('QK', 'Y', 'BK', '0', { model: 'QN' });
        b.resistor('RK2', '/CLR', 'BK2', 4700);
        b.npn('QK2', 'Y', 'BK2', '0', { model: 'QN' });
        dtlReader(b);
      });
    }
    const r = await runOne(rule, b.build());
    expect(r.ruleErrors).toEqual([]);
    expect(r.findings.map((f) => f.data.count)).toEqual([2]);
  });
});
