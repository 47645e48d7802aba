// Assumption lists: located errors per assumption, conjunction, and refusing contradictions.
import { describe, expect, it } from 'vitest';
import { InputError } from '../errors';
import { evaluate } from './expr';
import { assumptionNets, conjunction, parseAssumptions, witnessAssumptions } from './assumptions';

describe('assumptions', () => {
  it('parses a list, names each one and lists the nets it constrains', () => {
    const list = parseAssumptions([
      { name: 'never clear and load together', text: '!(CLR & LD)' },
      { text: ' XSLICE3.EN -> !XSLICE4.EN ' },
    ]);
    expect(list.map((a) => a.name)).toEqual(['never clear and load together', 'XSLICE3.EN -> !XSLICE4.EN']);
    expect(assumptionNets(list)).toEqual(['CLR', 'LD', 'XSLICE3.EN', 'XSLICE4.EN']);
    const w = witnessAssumptions(list);
    expect(evaluate(conjunction(list), { CLR: 0, LD: 0, 'XSLICE3.EN': 0, 'XSLICE4.EN': 0, ...w })).toBe(1);
  });

  it('reports every bad assumption with its own location', () => {
    try {
      parseAssumptions([{ text: 'A &' }, { text: 'B' }, { text: '(C' }]);
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as InputError).diagnostics.map((d) => `${d.loc?.file}:${d.loc?.line}:${d.loc?.col}`)).toEqual([
        'assumption 1:1:4',
        'assumption 3:1:3',
      ]);
    }
  });

  it('refuses assumptions that cannot hold together', () => {
    const list = parseAssumptions([{ text: 'CLR' }, { text: 'LD' }, { text: '!(CLR & LD)' }]);
    expect(() => witnessAssumptions(list)).toThrow(/contradict each other/);
  });
});
