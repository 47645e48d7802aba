// Lines pulled up from a pulled-up node: the function (node ∧ ¬pull-downs, checked by truth table),
// the devices the line's high level rests on, chains of nodes, and the structures left unread.
import { describe, expect, it } from 'vitest';
import { support } from '../logic/expr';
import { netlist } from '../netlist/build';
import type { FlatNetlist } from '../netlist/ir';
import { nodeNamed, sameFunction } from './test-helpers';
import { extractLogic } from './index';
import type { LogicView } from './types';

const node = nodeNamed;
const names = (nl: FlatNetlist, devs: number[]) => devs.map((d) => nl.devices[d].name).sort();
const noPullUp = (view: LogicView, net: string) => view.diagnostics.some((d) => d.code === 'extract.no-pull-up' && d.message.includes(`net ${net} `));

/**
 * Wren-8 flag lines Y<k> pulled up by RC<k> from S, S pulled up by RS from VCC; each line pulled
 * low by QD<k> (base from D<k>) and QK<k> (base from CLR).
 *
 *   VCC ─RS─ S ─RC0─ Y0 ─┬─ QD0(D0) ─ 0
 *             └─RC1─ Y1   └─ QK0(CLR) ─ 0     …
 */
function flags(n: number, extra?: (b: ReturnType<typeof netlist>) => void): FlatNetlist {
  const b = netlist().rail('VCC', 5).resistor('RS', 'VCC', 'S', 100);
  for (let k = 0; k < n; k++) {
    b.resistor(`RC${k}`, 'S', `Y${k}`, 1000);
    b.resistor(`RD${k}`, `D${k}`, `BD${k}`, 4700).npn(`QD${k}`, `Y${k}`, `BD${k}`, '0');
    b.resistor(`RK${k}`, 'CLR', `BK${k}`, 4700).npn(`QK${k}`, `Y${k}`, `BK${k}`, '0');
  }
  extra?.(b);
  return b.build();
}

describe('lines pulled up from a pulled-up node (bipolar)', () => {
  it('a node nothing drives is always high: Y = !(D | CLR), its resistor and the node’s in the line’s devices', () => {
    const nl = flags(3);
    const view = extractLogic(nl);
    for (let k = 0; k < 3; k++) {
      const y = node(view, `Y${k}`);
      expect(sameFunction(y.fn, `!(D${k} | CLR)`)).toBe(true);
      expect(support(y.fn).has('S')).toBe(false);
      expect(names(nl, y.devices)).toEqual(expect.arrayContaining([`RC${k}`, 'RS']));
      // still no load of its own: a rule looking for lines hung from a node finds it as before
      expect(y.kind).toBe('open-collector');
      expect(y.pullUps).toEqual([]);
      expect(noPullUp(view, `Y${k}`)).toBe(false);
    }
  });

  it('a node an override pulls low is read: Y = S & !D, S = !CLR', () => {
    // the rewritten form: one override QS on S, the per-line overrides gone
    const b = netlist().rail('VCC', 5).resistor('RS', 'VCC', 'S', 100).resistor('RKS', 'CLR', 'BKS', 2200).npn('QS', 'S', 'BKS', '0');
    for (let k = 0; k < 2; k++) b.resistor(`RC${k}`, 'S', `Y${k}`, 1000).resistor(`RD${k}`, `D${k}`, `BD${k}`, 4700).npn(`QD${k}`, `Y${k}`, `BD${k}`, '0');
    const nl = b.build();
    const view = extractLogic(nl);
    expect(sameFunction(node(view, 'S').fn, '!CLR')).toBe(true);
    for (let k = 0; k < 2; k++) {
      const y = node(view, `Y${k}`);
      expect(sameFunction(y.fn, `S & !D${k}`)).toBe(true);
      expect(y.inputs).toContain('S');
      // S's own load belongs to S
      expect(names(nl, y.devices)).not.toContain('RS');
    }
  });

  it('a chain: Y hangs from T, T from S (nothing drives either) — Y = !D, every resistor of the chain in its devices', () => {
    const nl = netlist()
      .rail('VCC', 5)
      .resistor('RS', 'VCC', 'S', 100)
      .resistor('RT', 'S', 'T', 100)
      .resistor('RC', 'T', 'Y', 1000)
      .resistor('RD', 'D', 'BD', 4700)
      .npn('QD', 'Y', 'BD', '0')
      .build();
    const y = node(extractLogic(nl), 'Y');
    expect(sameFunction(y.fn, '!D')).toBe(true);
    expect(names(nl, y.devices)).toEqual(expect.arrayContaining(['RC', 'RT', 'RS']));
  });

  it('a chain through a driven node: Y = T & !D with T = !E', () => {
    const nl = netlist()
      .rail('VCC', 5)
      .resistor('RS', 'VCC', 'S', 100)
      .resistor('RT', 'S', 'T', 470)
      .resistor('RE', 'E', 'BE', 4700)
      .npn('QE', 'T', 'BE', '0')
      .resistor('RC', 'T', 'Y', 1000)
      .resistor('RD', 'D', 'BD', 4700)
      .npn('QD', 'Y', 'BD', '0')
      .build();
    const view = extractLogic(nl);
    expect(sameFunction(node(view, 'T').fn, '!E')).toBe(true);
    expect(sameFunction(node(view, 'Y').fn, 'T & !D')).toBe(true);
  });

  it('not read as a pull-up: a resistor into a transistor base, or two nodes feeding one line', () => {
    // Y's only resistor goes to a base node (an RTL input), not to a pulled-up node
    const base = netlist().rail('VCC', 5).resistor('RB', 'VCC', 'B2', 10000).npn('Q2', 'Z', 'B2', '0').resistor('RZ', 'VCC', 'Z', 1000);
    base.resistor('RC', 'B2', 'Y', 1000).resistor('RD', 'D', 'BD', 4700).npn('QD', 'Y', 'BD', '0');
    const v1 = extractLogic(base.build());
    expect(sameFunction(node(v1, 'Y').fn, '!D')).toBe(true);
    expect(noPullUp(v1, 'Y')).toBe(true);
    // Y fed from S1 and S2 at the same distance from the rail: a divider, left as it was
    const two = netlist().rail('VCC', 5).resistor('R1', 'VCC', 'S1', 100).resistor('R2', 'VCC', 'S2', 100);
    two.resistor('RC1', 'S1', 'Y', 1000).resistor('RC2', 'S2', 'Y', 1000).resistor('RD', 'D', 'BD', 4700).npn('QD', 'Y', 'BD', '0');
    const v2 = extractLogic(two.build());
    expect(noPullUp(v2, 'Y')).toBe(true);
  });

  it('a node with a resistor to ground is a divider, not a pulled-up node', () => {
    const nl = flags(1, (b) => b.resistor('RG', 'S', '0', 1000));
    const view = extractLogic(nl);
    expect(noPullUp(view, 'Y0')).toBe(true);
  });
});

describe('lines pulled up from a pulled-up node (NMOS)', () => {
  it('NMOS lines hung from S: Y = !(D | CLR); with an NMOS on S instead, Y = S & !D', () => {
    const before = netlist().rail('VCC', 5).resistor('RS', 'VCC', 'S', 4700);
    for (let k = 0; k < 2; k++) before.resistor(`RL${k}`, 'S', `Y${k}`, 47000).nmos(`MD${k}`, `Y${k}`, `D${k}`, '0').nmos(`MK${k}`, `Y${k}`, 'CLR', '0');
    const vb = extractLogic(before.build());
    for (let k = 0; k < 2; k++) expect(sameFunction(node(vb, `Y${k}`).fn, `!(D${k} | CLR)`)).toBe(true);

    const after = netlist().rail('VCC', 5).resistor('RS', 'VCC', 'S', 4700).nmos('MK', 'S', 'CLR', '0');
    for (let k = 0; k < 2; k++) after.resistor(`RL${k}`, 'S', `Y${k}`, 47000).nmos(`MD${k}`, `Y${k}`, `D${k}`, '0');
    const va = extractLogic(after.build());
    expect(sameFunction(node(va, 'S').fn, '!CLR')).toBe(true);
    for (let k = 0; k < 2; k++) expect(sameFunction(node(va, `Y${k}`).fn, `S & !D${k}`)).toBe(true);
  });
});
