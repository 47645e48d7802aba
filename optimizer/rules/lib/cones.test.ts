// Fan-out-free cones: which nets are roots, what a cone holds, devices shared with other nodes,
// and chains far deeper than the call stack, walked and evaluated without recursion.
import { describe, expect, it } from 'vitest';
import { extractLogic } from '../../extract';
import type { LogicNode, LogicView } from '../../extract/types';
import { and, evaluate, exprToString, not, or, v, type Expr } from '../../logic/expr';
import { fromExprs, fromNetwork, mintermsOf } from '../../logic/truth-table';
import { NetlistBuilder } from '../../netlist/build';
import { composeCone, fanoutFreeCones, readersOf } from './cones';

/** A bare logic view of static nodes (only the fields cone finding reads are meaningful). */
function viewOf(nodes: { name: string; fn: Expr; devices: number[]; kind?: LogicNode['kind'] }[], stateBits: string[] = []): LogicView {
  const full = nodes.map((n, i) => ({
    net: i,
    name: n.name,
    kind: n.kind ?? 'static',
    family: 'gate',
    fn: n.fn,
    inputs: [...new Set(collect(n.fn))],
    devices: n.devices,
    pullUps: [],
    groups: [],
  })) as LogicNode[];
  return { title: 't', nodes: full, nodeByNet: new Map(full.map((n, i) => [n.net, i])), inputs: [], stateBits, rails: new Map(), family: 'gate', familyCounts: {} } as unknown as LogicView;
}

function collect(e: Expr): string[] {
  switch (e.op) {
    case 'var':
      return [e.name];
    case 'const':
      return [];
    case 'not':
      return collect(e.arg);
    case 'and':
    case 'or':
    case 'xor':
      return e.args.flatMap(collect);
    default:
      return [...collect(e.left), ...collect(e.right)];
  }
}

describe('fanoutFreeCones', () => {
  // Y = (A·B + C)' with T = A·B read only by Y; S = T2 read by Y and Z, so S is a root of its own.
  const view = () =>
    viewOf([
      { name: 'T', fn: and(v('A'), v('B')), devices: [0] },
      { name: 'S', fn: not(v('C')), devices: [1] },
      { name: 'Y', fn: not(or(v('T'), v('S'))), devices: [2] },
      { name: 'Z', fn: and(v('S'), v('D')), devices: [3] },
    ]);

  it('lists readers per net, a node reading a net twice counted twice', () => {
    const r = readersOf(viewOf([{ name: 'Y', fn: and(v('A'), v('A')), devices: [] }]));
    // inputs are de-duplicated by the view builder above, so add a duplicate reader by hand
    expect(r.get('A')).toEqual([0]);
    const twice = viewOf([{ name: 'Y', fn: v('A'), devices: [] }]);
    (twice.nodes[0] as { inputs: string[] }).inputs = ['A', 'A'];
    expect(readersOf(twice).get('A')).toEqual([0, 0]);
  });

  it('keeps single-reader nodes inside their reader\'s cone and cuts at nets read twice', () => {
    const cones = fanoutFreeCones(view(), 8);
    const byRoot = new Map(cones.map((c) => [c.root.name, c]));
    expect([...byRoot.keys()].sort()).toEqual(['S', 'Y', 'Z']);
    const y = byRoot.get('Y')!;
    expect(y.nodes.map((n) => n.name)).toEqual(['Y', 'T']);
    expect(y.leaves).toEqual(['A', 'B', 'S']);
    expect(y.devices).toEqual([2, 0]);
    expect(exprToString(y.fn)).toBe('!(A & B | S)');
    expect(byRoot.get('S')!.leaves).toEqual(['C']);
  });

  it('leaves out cones with more leaves than the limit, or fewer than asked for, and makes protected nets roots', () => {
    expect(fanoutFreeCones(view(), 2).map((c) => c.root.name).sort()).toEqual(['S', 'Z']);
    expect(fanoutFreeCones(view(), 8, new Set(), undefined, 2).map((c) => c.root.name).sort()).toEqual(['Y', 'Z']);
    const cones = fanoutFreeCones(view(), 8, new Set(['T']));
    expect(cones.find((c) => c.root.name === 'Y')!.leaves).toEqual(['S', 'T']);
    expect(cones.find((c) => c.root.name === 'T')!.leaves).toEqual(['A', 'B']);
  });

  it('drops a cone that shares a device with a node outside it', () => {
    const shared = viewOf([
      { name: 'T', fn: and(v('A'), v('B')), devices: [0, 9] },
      { name: 'Y', fn: not(v('T')), devices: [1] },
      { name: 'W', fn: or(v('A'), v('Y')), devices: [9] },
      { name: 'X', fn: not(v('Y')), devices: [2] },
    ]);
    const roots = fanoutFreeCones(shared, 8).map((c) => c.root.name);
    // Y's cone holds T, whose device 9 W also lists; W's own cone holds only half of device 9.
    expect(roots).toEqual(['X']);
  });

  it('treats state bits and non-static nodes as leaves', () => {
    const cones = fanoutFreeCones(
      viewOf(
        [
          { name: 'L', fn: v('D'), devices: [0], kind: 'latch' },
          { name: 'Y', fn: and(v('L'), v('E')), devices: [1] },
        ],
        ['L'],
      ),
      8,
    );
    expect(cones.map((c) => [c.root.name, c.leaves])).toEqual([['Y', ['E', 'L']]]);
  });

  it('walks and evaluates a chain far deeper than the call stack', () => {
    // N_k = NAND(N_{k-1}, B): two leaves, 50 000 nodes in one cone.
    const depth = 50_000;
    const nodes = Array.from({ length: depth }, (_, k) => ({ name: `N${k}`, fn: not(and(v(k === 0 ? 'A' : `N${k - 1}`), v('B'))), devices: [k] }));
    const cones = fanoutFreeCones(viewOf(nodes), 8);
    expect(cones).toHaveLength(1);
    const [cone] = cones;
    expect(cone.root.name).toBe(`N${depth - 1}`);
    expect(cone.leaves).toEqual(['A', 'B']);
    expect(cone.nodes).toHaveLength(depth);
    expect(cone.devices).toHaveLength(depth);
    const table = fromNetwork(cone.leaves, [...cone.nodes].reverse(), cone.root.name);
    // With B = 0 the last NAND gives 1; with B = 1 each stage inverts, and an even number of
    // inversions after N0 = A' leaves A. Minterm m = 2A + B: on at 0, 2 (B = 0) and 3 (A = B = 1).
    expect(mintermsOf(table.outputs[0].on, 2)).toEqual([0, 2, 3]);
  });

  it('composes the same function node by node as by nesting', () => {
    const nodes = [
      { name: 'P', fn: or(v('A'), not(v('B'))), devices: [0] },
      { name: 'Q', fn: and(v('P'), v('C')), devices: [1] },
      { name: 'R', fn: not(and(v('Q'), v('A'))), devices: [2] },
    ];
    const [cone] = fanoutFreeCones(viewOf(nodes), 8);
    const fn = composeCone(cone.root, cone.nodes);
    const t1 = fromExprs(cone.leaves, [{ name: 'R', fn }]);
    const t2 = fromNetwork(cone.leaves, [...cone.nodes].reverse(), 'R');
    expect([...t2.outputs[0].on]).toEqual([...t1.outputs[0].on]);
    for (let m = 0; m < 8; m++) {
      const env = { A: (m >> 2) & 1, B: (m >> 1) & 1, C: m & 1 } as Record<string, 0 | 1>;
      const expected = evaluate(not(and(and(or(v('A'), not(v('B'))), v('C')), v('A'))), env);
      expect(evaluate(fn, env)).toBe(expected);
    }
  });

  it('finds the cones of an extracted gate-level netlist', () => {
    const b = new NetlistBuilder('Wren-8 carry cell');
    b.gate('U1', 'and', ['T1', 'A', 'B']);
    b.gate('U2', 'and', ['T2', 'A', 'C']);
    b.gate('U3', 'or', ['CY', 'T1', 'T2']);
    const cones = fanoutFreeCones(extractLogic(b.build()), 8);
    const cy = cones.find((c) => c.root.name === 'CY')!;
    expect(cy.leaves).toEqual(['A', 'B', 'C']);
    expect(cy.nodes.map((n) => n.name).sort()).toEqual(['CY', 'T1', 'T2']);
  });
});
