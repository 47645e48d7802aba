// NameTable numbers names in first-seen order, exactly as a Map filled the same way would; Repeats
// finds the names a Set would already hold.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { NameTable, Repeats } from './name-table';

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

describe('Repeats', () => {
  it('finds each later entry of a name seen before, across growths of its list', () => {
    const names = Array.from({ length: 3000 }, (_, i) => `S${i % 1000}_Q`);
    const r = new Repeats();
    for (const n of names) r.add(n);
    expect(r.find((i) => names[i])).toEqual(Array.from({ length: 2000 }, (_, k) => 1000 + k));
  });

  it('finds a name written many times over, and names that share a hash', () => {
    // R49092 and R66186 have the same hash
    const names = ['R1', ...Array.from({ length: 50 }, () => 'R1'), 'R2', 'R49092', 'R66186', 'R2', 'R66186'];
    const r = new Repeats(4);
    for (const n of names) r.add(n);
    expect(r.find((i) => names[i])).toEqual([...Array.from({ length: 50 }, (_, k) => k + 1), 54, 55]);
    const shared = ['R66186', ...Array.from({ length: 20 }, (_, k) => (k % 2 ? 'R66186' : 'R49092'))];
    const many = new Repeats();
    for (const n of shared) many.add(n);
    expect(many.find((i) => shared[i])).toEqual(Array.from({ length: 19 }, (_, k) => k + 2));
  });

  it('agrees with a Set over the same names', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ maxLength: 3 }), { maxLength: 400 }), fc.nat(500), (names, expected) => {
        const r = new Repeats(expected);
        for (const n of names) r.add(n);
        const s = new Set<string>();
        const want: number[] = [];
        names.forEach((n, i) => {
          if (s.has(n)) want.push(i);
          s.add(n);
        });
        expect(r.find((i) => names[i])).toEqual(want);
      }),
    );
  });
});
