// Generated bit-sliced designs: requested size, slice structure, and decks that read back cleanly.
import { describe, expect, it } from 'vitest';
import { readSpice } from '@/optimizer/formats/spice/read';
import { writeSpice } from '@/optimizer/formats/spice/write';
import { countParts } from './counts';
import { flatten } from './flatten';
import { generateBitSliced, slicesFor, TRANSISTORS_PER_SLICE, type Family } from './generate';

describe.each<Family>(['rtl', 'cmos'])('generateBitSliced %s', (family) => {
  it('has the transistors per slice it promises, hierarchical or flat', () => {
    const hier = countParts(generateBitSliced({ slices: 8, family }));
    const flat = countParts(generateBitSliced({ slices: 8, family, flat: true }));
    expect(hier.transistors).toBe(8 * TRANSISTORS_PER_SLICE[family]);
    expect(flat.transistors).toBe(hier.transistors);
    expect(flat.resistors).toBe(hier.resistors);
  });

  it('flattens hierarchical and flat forms to the same size, with the enable inverters on the shared LOAD net', () => {
    const a = flatten(generateBitSliced({ slices: 4, family }));
    const b = flatten(generateBitSliced({ slices: 4, family, flat: true }));
    expect(a.devices.length).toBe(b.devices.length);
    expect(a.nets.length).toBe(b.nets.length);
    const load = a.netByName.get('LOAD')!;
    const onLoad = a.devices.filter((d) => d.kind !== 'vsource' && d.terminals.includes(load));
    expect(onLoad).toHaveLength(family === 'rtl' ? 4 : 8);
  });

  it('writes a deck that reads back with no warnings', () => {
    const design = generateBitSliced({ slices: 3, family });
    const { design: back, diagnostics } = readSpice(writeSpice(design), 'g.cir');
    expect(diagnostics).toEqual([]);
    expect(countParts(back).transistors).toBe(3 * TRANSISTORS_PER_SLICE[family]);
  });
});

it('slicesFor rounds to the nearest whole slice', () => {
  expect(slicesFor(100_000, 'rtl')).toBe(20_000);
  expect(slicesFor(3, 'cmos')).toBe(1);
});
