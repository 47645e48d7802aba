// NameTable numbers names in first-seen order, exactly as a Map filled the same way would.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { NameTable } from './name-table';

describe('NameTable', () => {
  it('numbers names in first-seen order and gives repeats their first number', () => {
    const t = new NameTable();
    expect(t.add('VCC')).toBe(0);
    expect(t.add('S0_Q')).toBe(1);
    expect(t.add('VCC')).toBe(0);
    expect(t.add('vcc')).toBe(2); // case-sensitive: case folding is the reader's job
    expect(t.get('S0_Q')).toBe(1);
    expect(t.get('S1_Q')).toBe(-1);
    expect(t.names).toEqual(['VCC', 'S0_Q', 'vcc']);
    expect(t.size).toBe(3);
  });

  it('keeps every number through many growths of the table', () => {
    const t = new NameTable();
    for (let i = 0; i < 50_000; i++) expect(t.add(`S${i}_BEN`)).toBe(i);
    for (let i = 0; i < 50_000; i += 997) expect(t.get(`S${i}_BEN`)).toBe(i);
    expect(t.add('')).toBe(50_000);
    expect(t.get('')).toBe(50_000);
  });

  it('agrees with a Map numbering the same names', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ maxLength: 6 }), { maxLength: 400 }), (names) => {
        const t = new NameTable();
        const m = new Map<string, number>();
        for (const n of names) {
          if (!m.has(n)) m.set(n, m.size);
          expect(t.add(n)).toBe(m.get(n));
        }
        expect(t.names).toEqual([...m.keys()]);
      }),
    );
  });
});
