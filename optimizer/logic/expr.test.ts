// Expression parser and evaluator: precedence, associativity, names, located errors, round trips.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { InputError } from '../errors';
import { evaluate, evaluateWords, exprToString, support, and, or, not, v, type Expr } from './expr';
import { parseExpr } from './expr-parse';

const errorOf = (src: string): string => {
  try {
    parseExpr(src);
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as Error).message;
  }
  throw new Error(`"${src}" parsed without an error`);
};

describe('parseExpr precedence', () => {
  it('binds ! tighter than & tighter than ^ tighter than | tighter than -> tighter than <->', () => {
    expect(exprToString(parseExpr('!a & b | c'))).toBe('!a & b | c');
    expect(parseExpr('a | b & c')).toEqual({ op: 'or', args: [v('a'), { op: 'and', args: [v('b'), v('c')] }] });
    expect(parseExpr('a ^ b & c')).toEqual({ op: 'xor', args: [v('a'), { op: 'and', args: [v('b'), v('c')] }] });
    expect(parseExpr('a | b ^ c')).toEqual({ op: 'or', args: [v('a'), { op: 'xor', args: [v('b'), v('c')] }] });
    expect(parseExpr('a -> b | c').op).toBe('implies');
    expect(parseExpr('a <-> b -> c').op).toBe('iff');
    expect(parseExpr('!(a & b)')).toEqual({ op: 'not', arg: { op: 'and', args: [v('a'), v('b')] } });
  });

  it('makes -> right-associative: a -> b -> c is a -> (b -> c)', () => {
    const e = parseExpr('a -> b -> c');
    // a=1, b=1, c=0: right-assoc gives 0, left-assoc ((a->b)->c) also 0; a=0,b=0,c=0 separates them
    expect(evaluate(e, { a: 0, b: 0, c: 0 })).toBe(1);
    expect(e).toEqual({ op: 'implies', left: v('a'), right: { op: 'implies', left: v('b'), right: v('c') } });
  });

  it('reads hierarchical and bus net names, constants and the ~ spelling of not', () => {
    const e = parseExpr('!(XSLICE3.EN & D[3]) | 0 | ~CLR_L');
    expect([...support(e)]).toEqual(['XSLICE3.EN', 'D[3]', 'CLR_L']);
    expect(evaluate(e, { 'XSLICE3.EN': 1, 'D[3]': 1, CLR_L: 1 })).toBe(0);
    expect(evaluate(parseExpr('1 & !0'), {})).toBe(1);
  });

  it('evaluates the operators by their truth tables', () => {
    const rows: [string, number[]][] = [
      ['a & b', [0, 0, 0, 1]],
      ['a | b', [0, 1, 1, 1]],
      ['a ^ b', [0, 1, 1, 0]],
      ['a -> b', [1, 1, 0, 1]],
      ['a <-> b', [1, 0, 0, 1]],
    ];
    for (const [src, want] of rows) {
      const got = [0, 1, 2, 3].map((m) => evaluate(parseExpr(src), { a: (m >> 1) & 1 ? 1 : 0, b: m & 1 ? 1 : 0 }));
      expect(got, src).toEqual(want);
    }
  });
});

describe('parseExpr errors carry line and column', () => {
  it('names the operator an operand is missing after', () => {
    expect(errorOf('CLR & !')).toBe('assumption:1:8: expected a net name or "(" after "!"');
    expect(errorOf('CLR & | LD')).toBe('assumption:1:7: expected a net name or "(" after "&", found "|"');
  });
  it('reports unbalanced parentheses, stray characters, missing operators and empty input', () => {
    expect(errorOf('(a & b')).toBe('assumption:1:7: expected ")" to close the "(" at column 1, found the end');
    expect(errorOf('a & b)')).toBe('assumption:1:6: unmatched ")"');
    expect(errorOf('a + b')).toBe('assumption:1:3: unexpected character "+"');
    expect(errorOf('a b')).toBe('assumption:1:3: expected an operator (& | ^ -> <->) before "b"');
    expect(errorOf('   ')).toContain('assumption:1:4: expected a net name or "(" (the expression is empty)');
    expect(errorOf('a &\n  (b |')).toBe('assumption:2:7: expected a net name or "(" after "|"');
    expect(errorOf('D[x]')).toBe('assumption:1:2: expected a bus index like "[3]" after "D"');
  });
  it('refuses absurd nesting with an error instead of overflowing the stack', () => {
    expect(errorOf('('.repeat(5000) + 'a' + ')'.repeat(5000))).toMatch(/nested deeper/);
  });
  it('never throws anything but InputError on random text', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom(...'ab01()!&|^-<> .[]3~x'.split('')), maxLength: 30 }), (s) => {
        try {
          parseExpr(s);
        } catch (e) {
          if (!(e instanceof InputError)) throw e;
        }
      }),
      { numRuns: 2000 },
    );
  });
});

const arbExpr: fc.Arbitrary<Expr> = fc.letrec<{ e: Expr }>((tie) => ({
  e: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.constantFrom('a', 'b', 'c', 'X.d[2]').map((n) => v(n)),
    fc.constantFrom<Expr>({ op: 'const', value: 0 }, { op: 'const', value: 1 }),
    tie('e').map((a) => ({ op: 'not', arg: a }) as Expr),
    fc.tuple(fc.constantFrom('and', 'or', 'xor'), tie('e'), tie('e')).map(([op, l, r]) => ({ op, args: [l, r] }) as Expr),
    fc.tuple(fc.constantFrom('implies', 'iff'), tie('e'), tie('e')).map(([op, left, right]) => ({ op, left, right }) as Expr),
  ),
})).e;

describe('exprToString', () => {
  it('prints text that parses back to a function with the same truth table', () => {
    fc.assert(
      fc.property(arbExpr, (e) => {
        const back = parseExpr(exprToString(e));
        for (let m = 0; m < 16; m++) {
          const env = { a: m & 1, b: (m >> 1) & 1, c: (m >> 2) & 1, 'X.d[2]': (m >> 3) & 1 } as Record<string, 0 | 1>;
          if (evaluate(back, env) !== evaluate(e, env)) return false;
        }
        return true;
      }),
      { numRuns: 500 },
    );
  });
  it('bit-parallel evaluation agrees with one-at-a-time evaluation', () => {
    fc.assert(
      fc.property(arbExpr, fc.array(fc.integer(), { minLength: 4, maxLength: 4 }), (e, ws) => {
        const names = ['a', 'b', 'c', 'X.d[2]'];
        const words = new Map(names.map((n, i) => [n, ws[i] | 0]));
        const w = evaluateWords(e, words);
        for (let bit = 0; bit < 32; bit++) {
          const env = Object.fromEntries(names.map((n, i) => [n, ((ws[i] >>> bit) & 1) as 0 | 1]));
          if (((w >>> bit) & 1) !== evaluate(e, env)) return false;
        }
        return true;
      }),
      { numRuns: 300 },
    );
  });
  it('the builders fold constants and double negation', () => {
    expect(exprToString(and(v('a'), { op: 'const', value: 1 }))).toBe('a');
    expect(exprToString(or(v('a'), { op: 'const', value: 1 }))).toBe('1');
    expect(exprToString(not(not(v('a'))))).toBe('a');
  });
});
