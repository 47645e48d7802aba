// Part counts of standard gates against textbook counts, and per-subcircuit / per-instance counts.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSpice } from '@/optimizer/formats/spice/read';
import { countParts } from './counts';

const fixtures = path.resolve(__dirname, '../../tests/fixtures/netlists');
const count = (file: string) => countParts(readSpice(readFileSync(path.join(fixtures, file), 'utf8'), file).design);
const parts = (file: string) => {
  const { transistors, resistors, diodes, capacitors, gates } = count(file);
  return { transistors, resistors, diodes, capacitors, gates };
};
const none = { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0 };

describe('part counts of standard gates', () => {
  // Weste & Harris, CMOS VLSI Design (from memory): inverter 2, NAND-n 2n, NOR-n 2n,
  // transmission gate 2, tri-state inverter 4. Load resistors in the decks are test fixtures.
  it('CMOS inverter has 2 transistors', () => expect(parts('cmos-inverter.cir')).toEqual({ ...none, transistors: 2 }));
  it('CMOS NAND-2 has 4 transistors', () => expect(parts('cmos-nand2.cir')).toEqual({ ...none, transistors: 4 }));
  it('CMOS NAND-3 has 6 transistors', () => expect(parts('cmos-nand3.cir')).toEqual({ ...none, transistors: 6 }));
  it('CMOS NOR-2 has 4 transistors', () => expect(parts('cmos-nor2.cir')).toEqual({ ...none, transistors: 4 }));
  it('transmission gate has 2 transistors (plus the deck\'s load resistor)', () =>
    expect(parts('cmos-tgate.cir')).toEqual({ ...none, transistors: 2, resistors: 1 }));
  it('tri-state inverter has 4 transistors (plus the deck\'s load resistor)', () =>
    expect(parts('cmos-tristate-inv.cir')).toEqual({ ...none, transistors: 4, resistors: 1 }));
  // Mano, Digital Design, chapter on digital integrated circuits (from memory).
  it('RTL inverter has 1 transistor and 2 resistors', () => expect(parts('rtl-inverter.cir')).toEqual({ ...none, transistors: 1, resistors: 2 }));
  it('RTL NOR-3 has n = 3 transistors and n + 1 = 4 resistors', () =>
    expect(parts('rtl-nor3.cir')).toEqual({ ...none, transistors: 3, resistors: 4 }));
  it('DTL NAND-2 has 1 transistor, n + 2 = 4 diodes, 3 resistors', () =>
    expect(parts('dtl-nand2.cir')).toEqual({ ...none, transistors: 1, diodes: 4, resistors: 3 }));
  it('DTL NAND-3 has 1 transistor, n + 2 = 5 diodes, 3 resistors', () =>
    expect(parts('dtl-nand3.cir')).toEqual({ ...none, transistors: 1, diodes: 5, resistors: 3 }));
  it('NMOS NOR-2 with a resistor load has 2 transistors and 1 resistor (common practice)', () =>
    expect(parts('nmos-load-nor2.cir')).toEqual({ ...none, transistors: 2, resistors: 1 }));
});

describe('counts per subcircuit and per instance', () => {
  it('multiplies the bit-slice cell by its 8 instances', () => {
    const c = count('wren8-bus.cir');
    const slice = c.bySubcircuit.SLICE;
    expect(slice.own).toEqual({ ...none, transistors: 4, resistors: 6 });
    expect(slice.instances).toBe(8);
    // 8 slices of 4 transistors; resistors: 8 × 6 in the slices plus 8 output loads at the top.
    expect(c.transistors).toBe(32);
    expect(c.resistors).toBe(56);
    expect(Object.keys(c.byInstance)).toEqual(['X0', 'X1', 'X2', 'X3', 'X4', 'X5', 'X6', 'X7']);
    expect(c.byInstance.X5).toEqual(slice.total);
  });

  it('gives nested instance paths and caps the listing', () => {
    const deck = [
      't',
      '.subckt INV a y',
      'RB a b 1k',
      'Q1 y b 0 QN',
      '.ends',
      '.subckt PAIR a y',
      'X1 a m INV',
      'X2 m y INV',
      '.ends',
      'XP1 in1 out1 PAIR',
      'XP2 in2 out2 PAIR',
      '.model QN NPN',
    ].join('\n');
    const design = readSpice(deck, 'n.cir').design;
    const c = countParts(design);
    expect(c.bySubcircuit.INV.instances).toBe(4);
    expect(c.bySubcircuit.PAIR.total).toEqual({ ...none, transistors: 2, resistors: 2 });
    expect(Object.keys(c.byInstance)).toEqual(['XP1', 'XP2', 'XP1.X1', 'XP1.X2', 'XP2.X1', 'XP2.X2']);
    expect(c.transistors).toBe(4);
    const capped = countParts(design, 3);
    expect(Object.keys(capped.byInstance)).toHaveLength(3);
    expect(capped.byInstanceTruncated).toBe(true);
  });
});
