// Proves part counting by kind, gate-level equivalents, pricing from the table and budgets.
import { describe, expect, it } from 'vitest';
import { sliceInverters } from '../rules/test-helpers';
import { emptyEdit } from '../rules/types';
import { budgetReport, countKinds, editSavings, gateEquivalent, partsOf } from './cost';
import { DEFAULT_PARTS_TABLE, PartsTableSchema } from './parts-table';

describe('parts table', () => {
  it('labels its defaults as invented demo prices and satisfies its schema', () => {
    expect(DEFAULT_PARTS_TABLE.note).toMatch(/invented demo prices/);
    expect(PartsTableSchema.safeParse(DEFAULT_PARTS_TABLE).success).toBe(true);
  });
});

describe('counting and pricing', () => {
  it('counts parts by kind; sources are not parts', () => {
    const nl = sliceInverters(3);
    expect(countKinds(nl.devices)).toMatchObject({ npn: 3, resistor: 6, diode: 0 });
    const p = partsOf(nl.devices);
    expect(p).toMatchObject({ transistors: 3, resistors: 6 });
    const t = DEFAULT_PARTS_TABLE.parts;
    expect(p.areaMm2).toBeCloseTo(3 * t.npn.areaMm2 + 6 * t.resistor.areaMm2, 9);
    expect(p.cost).toBeCloseTo(3 * t.npn.price + 6 * t.resistor.price, 9);
  });

  it('counts gate-level primitives as gates and as mapped transistors', () => {
    // Weste & Harris (from memory): CMOS NAND-2 4 transistors, inverter 2; AND-2 = NAND-2 + inverter = 6.
    expect(gateEquivalent('nand', 2, 'cmos').transistors).toBe(4);
    expect(gateEquivalent('and', 2, 'cmos').transistors).toBe(6);
    expect(gateEquivalent('notif1', 2, 'cmos').transistors).toBe(4);
    // Mano (from memory): RTL NOR-3 = 3 transistors, 4 resistors.
    expect(gateEquivalent('nor', 3, 'rtl')).toMatchObject({ transistors: 3, resistors: 4 });
    const gates = [
      { kind: 'gate' as const, op: 'nand' as const, terminals: ['y', 'a', 'b'] },
      { kind: 'gate' as const, op: 'not' as const, terminals: ['z', 'y'] },
    ];
    expect(partsOf(gates)).toMatchObject({ gates: 2, transistors: 6 });
    expect(partsOf(gates, 'dtl')).toMatchObject({ gates: 2, transistors: 2, diodes: 7, resistors: 6 });
  });

  it('prices an edit as removed minus added', () => {
    const nl = sliceInverters(2);
    const edit = { ...emptyEdit(), removeDevices: ['XS1.Q1', 'XS1.RC', 'XS1.RB'], addDevices: [{ name: 'D1', kind: 'diode' as const, terminals: ['a', 'b'] }] };
    const s = editSavings(nl, edit);
    const t = DEFAULT_PARTS_TABLE.parts;
    expect(s).toMatchObject({ transistors: 1, resistors: 2, diodes: -1 });
    expect(s.cost).toBeCloseTo(t.npn.price + 2 * t.resistor.price - t.diode.price, 6);
  });
});

describe('budgets', () => {
  it('reports use against a board budget before and after savings', () => {
    const nl = sliceInverters(4);
    const totals = partsOf(nl.devices);
    const before = budgetReport(totals, { parts: 10 });
    expect(before.parts).toEqual({ used: 12, limit: 10, over: 2, ok: false });
    const saving = editSavings(nl, { ...emptyEdit(), removeDevices: ['XS1.Q1', 'XS1.RC', 'XS1.RB'] });
    const after = budgetReport(totals, { parts: 10 }, saving);
    expect(after.parts.ok).toBe(true);
    expect(after.cost.ok).toBe(true);
    expect(after.cost.limit).toBeUndefined();
  });
});
