// Canonical proof keys: the same circuit under other names gets the same key, and anything the
// proof depends on (a value, a connection, the names' sort order, an assumption) changes it.
import { describe, expect, it } from 'vitest';
import { parseExpr } from '../logic/expr-parse';
import { NetlistBuilder } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { positions, proofKey } from './proof-key';

/** One Wren-8 register-file load inverter under a chosen instance name and input net. */
function slice(inst: string, input: string, rc = 1000): FlatNetlist {
  const b = new NetlistBuilder('Wren-8 slice');
  b.rail('VCC', 5);
  b.within([inst], () => {
    b.resistor('RC', 'VCC', 'LDN', rc);
    b.resistor('RB', `/${input}`, 'B', 4700);
    b.npn('Q1', 'LDN', 'B', '0');
  });
  return b.build();
}

const key = (nl: FlatNetlist, changed: string[], assume: string[] = []) =>
  proofKey(nl, nl, changed, assume.map((a) => ({ expr: parseExpr(a) })), 'x')!;

describe('proofKey', () => {
  it('gives two slices of the same circuit the same key and pairs their names by position', () => {
    const a = key(slice('XS3', 'LD3'), ['XS3.LDN']);
    const b = key(slice('XS4', 'LD4'), ['XS4.LDN']);
    expect(a.key).toBe(b.key);
    const at = positions(a);
    expect(b.names[at.get('XS3.LDN')!]).toBe('XS4.LDN');
    expect(b.names[at.get('LD3')!]).toBe('LD4');
  });

  it('tells apart a different value, a different compared net and a different sort order of names', () => {
    const base = key(slice('XS3', 'LD3'), ['XS3.LDN']).key;
    expect(key(slice('XS4', 'LD4', 2200), ['XS4.LDN']).key).not.toBe(base);
    expect(key(slice('XS4', 'LD4'), ['XS4.B']).key).not.toBe(base);
    // "ZZ" sorts after the slice's own nets where "LD3" sorted before them: inputs would be ordered differently
    expect(key(slice('XS4', 'ZZ'), ['XS4.LDN']).key).not.toBe(base);
  });

  it('renames assumption variables with the nets, and outside variables by first appearance', () => {
    const a = key(slice('XS3', 'LD3'), ['XS3.LDN'], ['LD3 -> P']);
    expect(key(slice('XS4', 'LD4'), ['XS4.LDN'], ['LD4 -> P']).key).toBe(a.key);
    expect(key(slice('XS4', 'LD4'), ['XS4.LDN'], ['P -> LD4']).key).not.toBe(a.key);
    expect(key(slice('XS4', 'LD4'), ['XS4.LDN']).key).not.toBe(a.key);
  });

  it('does not key regions past its size limit', () => {
    const b = new NetlistBuilder('Wren-8 big');
    for (let k = 0; k < 4001; k++) b.resistor(`R${k}`, `N${k}`, `N${k + 1}`, 1000);
    const nl = b.build();
    expect(proofKey(nl, nl, [], [], '')).toBeUndefined();
  });
});
