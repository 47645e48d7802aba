// Equivalence checking: hand-made cases (proved, refuted, proved only under an assumption, SAT
// beyond the exhaustive limit), and property tests against exhaustive switch-level simulation of
// random gate-level circuits: the verdicts agree, and every counterexample separates the designs.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { netlist, type NetlistBuilder } from '../netlist/build';
import type { FlatNetlist, GateOp } from '../netlist/ir';
import { evaluate, not, and, or, type Expr } from '../logic/expr';
import { parseExpr } from '../logic/expr-parse';
import { extractLogic } from '../extract/index';
import { combinationalModel } from '../extract/compose';
import { simulate } from './switch-sim';
import { checkEquivalence, type Assumption } from './equivalence';

const p = parseExpr;

describe('checkEquivalence by hand', () => {
  it('proves De Morgan exhaustively and names no assumption', () => {
    const r = checkEquivalence({ y: p('!(a & b)') }, { y: p('!a | !b') });
    expect(r).toMatchObject({ verdict: 'proved', method: 'exhaustive', assumptionsUsed: [] });
  });

  it('proves a don\'t-care simplification only under the assumption it needs', () => {
    // "clear and load are never active together": with !(CLR & LD), CLR | LD & D equals CLR ^ LD & D
    const assumptions: Assumption[] = [
      { name: 'never clear and load together', expr: p('!(CLR & LD)') },
      { name: 'unrelated', expr: p('EN | !EN') },
    ];
    const r = checkEquivalence({ q: p('CLR | LD & D') }, { q: p('CLR ^ LD & D') }, { assumptions });
    expect(r).toMatchObject({ verdict: 'proved', assumptionsUsed: ['never clear and load together'] });
    const without = checkEquivalence({ q: p('CLR | LD & D') }, { q: p('CLR ^ LD & D') });
    expect(without.verdict).toBe('refuted');
    if (without.verdict === 'refuted') expect(without.counterexample).toMatchObject({ CLR: 1, LD: 1, D: 1 });
  });

  it('uses SAT beyond the exhaustive limit and finds the one distinguishing vector', () => {
    const names = Array.from({ length: 24 }, (_, i) => `D[${i}]`);
    const wide = and(...names.map((n) => p(n)));
    const short = and(...names.slice(0, 23).map((n) => p(n)));
    const r = checkEquivalence({ all: wide }, { all: short });
    expect(r.verdict).toBe('refuted');
    expect(r.method).toBe('sat');
    if (r.verdict === 'refuted') {
      expect(r.counterexample['D[23]']).toBe(0);
      expect(names.slice(0, 23).every((n) => r.counterexample[n] === 1)).toBe(true);
    }
    const parity = (ns: string[]) => p(ns.join(' ^ '));
    // complementing an even number of inputs leaves the parity unchanged; an odd number flips it
    // (mathematics)
    const flipped = p(names.map((n) => `!${n}`).join(' ^ '));
    expect(checkEquivalence({ par: parity(names) }, { par: flipped })).toMatchObject({ verdict: 'proved', method: 'sat' });
    const odd = p([...names.slice(0, 23).map((n) => `!${n}`), names[23]].join(' ^ '));
    expect(checkEquivalence({ par: parity(names) }, { par: odd }).verdict).toBe('refuted');
  });

  it('refuses output sets that do not match', () => {
    expect(() => checkEquivalence({ a: p('x') }, { b: p('x') })).toThrow(/outputs not on both sides: a, b/);
  });
});

// ---- random gate-level circuits -------------------------------------------------------------

const INPUTS = ['a', 'b', 'c', 'd'];

const arbExpr: fc.Arbitrary<Expr> = fc.letrec<{ e: Expr }>((tie) => ({
  e: fc.oneof(
    { depthSize: 'small', maxDepth: 4 },
    fc.constantFrom(...INPUTS).map((n) => ({ op: 'var', name: n }) as Expr),
    tie('e').map((a) => ({ op: 'not', arg: a }) as Expr),
    fc.tuple(fc.constantFrom('and', 'or', 'xor'), tie('e'), tie('e')).map(([op, l, r]) => ({ op, args: [l, r] }) as Expr),
  ),
})).e;

/** An equivalent circuit of different structure: De Morgan on every and/or, xor as and/or. */
function restructure(e: Expr): Expr {
  switch (e.op) {
    case 'and':
      return { op: 'not', arg: { op: 'or', args: e.args.map((x) => ({ op: 'not', arg: restructure(x) }) as Expr) } };
    case 'or':
      return { op: 'not', arg: { op: 'and', args: e.args.map((x) => ({ op: 'not', arg: restructure(x) }) as Expr) } };
    case 'xor': {
      const [l, r] = e.args.map(restructure);
      return or(and(l, not(r)), and(not(l), r));
    }
    case 'not':
      return { op: 'not', arg: restructure(e.arg) };
    default:
      return e;
  }
}

/** Builds the expression as gate primitives driving `out`. */
function gatesFor(b: NetlistBuilder, e: Expr, out: string, counter = { n: 0 }): string {
  const node = (op: GateOp, ins: string[]) => {
    const o = out || `n${++counter.n}`;
    b.gate(`G${++counter.n}`, op, [o, ...ins]);
    return o;
  };
  switch (e.op) {
    case 'var':
      return out ? node('buf', [e.name]) : e.name;
    case 'const':
      throw new Error('no constants in generated circuits');
    case 'not':
      return node('not', [gatesFor(b, e.arg, '', counter)]);
    case 'and':
    case 'or':
    case 'xor':
      return node(e.op, e.args.map((x) => gatesFor(b, x, '', counter)));
    default:
      throw new Error(`unexpected ${e.op}`);
  }
}

function circuit(e: Expr): FlatNetlist {
  const b = netlist();
  for (const i of INPUTS) b.net(i);
  gatesFor(b, e, 'y');
  return b.build();
}

const ALL_VECTORS = Array.from({ length: 16 }, (_, m) => Object.fromEntries(INPUTS.map((n, i) => [n, ((m >> i) & 1) as 0 | 1])));

function simulateY(nl: FlatNetlist, vectors: Record<string, 0 | 1>[]): (0 | 1 | 'X' | 'Z')[] {
  return simulate(nl, { kind: 'vectors', vectors }, { watch: ['y'] }).waveforms.y;
}

describe('equivalence agrees with exhaustive switch-level simulation (property)', () => {
  const pair = fc.tuple(arbExpr, fc.oneof(fc.constant(undefined), arbExpr), fc.oneof(fc.constant(undefined), arbExpr), fc.boolean());
  for (const forceSat of [false, true]) {
    it(`verdicts match and counterexamples separate the designs (${forceSat ? 'SAT' : 'default methods'})`, () => {
      fc.assert(
        fc.property(pair, ([e1, other, assume, useAssume]) => {
          const e2 = other ?? restructure(e1);
          const a = circuit(e1);
          const b = circuit(e2);
          const before = combinationalModel(extractLogic(a), ['y']).outputs;
          const after = combinationalModel(extractLogic(b), ['y']).outputs;
          const assumptions = useAssume && assume ? [{ name: 'A1', expr: assume }] : [];
          const result = checkEquivalence(before, after, {
            assumptions,
            ...(forceSat ? { exhaustiveLimit: 0, randomWords: 0 } : {}),
          });
          const ya = simulateY(a, ALL_VECTORS);
          const yb = simulateY(b, ALL_VECTORS);
          const differs = ALL_VECTORS.some((v, i) => (assumptions.length === 0 || evaluate(assumptions[0].expr, v) === 1) && ya[i] !== yb[i]);
          expect(result.verdict).toBe(differs ? 'refuted' : 'proved');
          if (result.verdict === 'refuted') {
            const cex = Object.fromEntries(INPUTS.map((n) => [n, result.counterexample[n] ?? 0])) as Record<string, 0 | 1>;
            const [sa] = simulateY(a, [cex]);
            const [sb] = simulateY(b, [cex]);
            expect(sa).not.toBe(sb);
            expect([sa, sb]).toEqual([result.outputs[0].before, result.outputs[0].after]);
            if (assumptions.length) expect(evaluate(assumptions[0].expr, cex)).toBe(1);
          }
        }),
        { numRuns: forceSat ? 60 : 120 },
      );
    });
  }
});
