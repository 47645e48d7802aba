// Boolean expressions over net names: the AST shared by assumptions, extracted node functions and
// equivalence checks, with evaluation, printing, variable support and a few structural helpers.

export type Expr =
  | { op: 'const'; value: 0 | 1 }
  | { op: 'var'; name: string }
  | { op: 'not'; arg: Expr }
  | { op: 'and'; args: Expr[] }
  | { op: 'or'; args: Expr[] }
  | { op: 'xor'; args: Expr[] }
  | { op: 'implies'; left: Expr; right: Expr }
  | { op: 'iff'; left: Expr; right: Expr };

export const TRUE: Expr = { op: 'const', value: 1 };
export const FALSE: Expr = { op: 'const', value: 0 };

export const v = (name: string): Expr => ({ op: 'var', name });
export const c = (value: 0 | 1): Expr => (value ? TRUE : FALSE);

/** Negation that folds constants and double negations so extracted functions stay readable. */
export function not(arg: Expr): Expr {
  if (arg.op === 'const') return arg.value ? FALSE : TRUE;
  if (arg.op === 'not') return arg.arg;
  return { op: 'not', arg };
}

function nary(op: 'and' | 'or', args: Expr[]): Expr {
  const absorbing = op === 'and' ? 0 : 1;
  const flat: Expr[] = [];
  for (const a of args) {
    if (a.op === 'const') {
      if (a.value === absorbing) return c(absorbing);
      continue; // the identity element drops out
    }
    if (a.op === op) flat.push(...a.args);
    else flat.push(a);
  }
  if (flat.length === 0) return c(absorbing === 0 ? 1 : 0);
  if (flat.length === 1) return flat[0];
  return { op, args: flat };
}

export const and = (...args: Expr[]): Expr => nary('and', args);
export const or = (...args: Expr[]): Expr => nary('or', args);
export function xor(...args: Expr[]): Expr {
  if (args.length === 1) return args[0];
  if (args.length === 0) return FALSE;
  return { op: 'xor', args };
}
export const implies = (left: Expr, right: Expr): Expr => ({ op: 'implies', left, right });
export const iff = (left: Expr, right: Expr): Expr => ({ op: 'iff', left, right });

export type Assignment = Record<string, 0 | 1 | boolean> | Map<string, 0 | 1 | boolean>;

/** Evaluates under an assignment; a variable the assignment lacks is the caller's error. */
export function evaluate(e: Expr, env: Assignment): 0 | 1 {
  const get =
    env instanceof Map
      ? (n: string) => env.get(n)
      : (n: string) => (Object.prototype.hasOwnProperty.call(env, n) ? env[n] : undefined);
  const go = (x: Expr): boolean => {
    switch (x.op) {
      case 'const':
        return x.value === 1;
      case 'var': {
        const val = get(x.name);
        if (val === undefined) throw new RangeError(`no value for "${x.name}"`);
        return val === 1 || val === true;
      }
      case 'not':
        return !go(x.arg);
      case 'and':
        return x.args.every(go);
      case 'or':
        return x.args.some(go);
      case 'xor':
        return x.args.reduce((acc, a) => acc !== go(a), false);
      case 'implies':
        return !go(x.left) || go(x.right);
      case 'iff':
        return go(x.left) === go(x.right);
    }
  };
  return go(e) ? 1 : 0;
}

/**
 * Bit-parallel evaluation: each variable maps to a 32-bit word of 32 independent assignments,
 * so one pass evaluates 32 input vectors.
 */
export function evaluateWords(e: Expr, words: Map<string, number>): number {
  switch (e.op) {
    case 'const':
      return e.value ? -1 | 0 : 0;
    case 'var': {
      const w = words.get(e.name);
      if (w === undefined) throw new RangeError(`no value for "${e.name}"`);
      return w | 0;
    }
    case 'not':
      return ~evaluateWords(e.arg, words);
    case 'and':
      return e.args.reduce((acc, a) => acc & evaluateWords(a, words), -1 | 0);
    case 'or':
      return e.args.reduce((acc, a) => acc | evaluateWords(a, words), 0);
    case 'xor':
      return e.args.reduce((acc, a) => acc ^ evaluateWords(a, words), 0);
    case 'implies':
      return ~evaluateWords(e.left, words) | evaluateWords(e.right, words);
    case 'iff':
      return ~(evaluateWords(e.left, words) ^ evaluateWords(e.right, words));
  }
}

/** Variables an expression mentions, in first-appearance order. */
export function support(e: Expr, into: Set<string> = new Set()): Set<string> {
  switch (e.op) {
    case 'const':
      break;
    case 'var':
      into.add(e.name);
      break;
    case 'not':
      support(e.arg, into);
      break;
    case 'and':
    case 'or':
    case 'xor':
      for (const a of e.args) support(a, into);
      break;
    case 'implies':
    case 'iff':
      support(e.left, into);
      support(e.right, into);
      break;
  }
  return into;
}

// Binding strength used by the printer; the parser uses the same table so a printed expression
// parses back to the same tree.
const PREC: Record<Expr['op'], number> = {
  iff: 1,
  implies: 2,
  or: 3,
  xor: 4,
  and: 5,
  not: 6,
  var: 7,
  const: 7,
};
const SYMBOL = { and: ' & ', or: ' | ', xor: ' ^ ' } as const;

/** Prints in the assumption language; parentheses only where precedence needs them. */
export function exprToString(e: Expr): string {
  const wrap = (x: Expr, min: number): string => {
    const s = exprToString(x);
    return PREC[x.op] < min ? `(${s})` : s;
  };
  switch (e.op) {
    case 'const':
      return String(e.value);
    case 'var':
      return e.name;
    case 'not':
      return '!' + wrap(e.arg, PREC.not);
    case 'and':
    case 'or':
    case 'xor':
      return e.args.map((a) => wrap(a, PREC[e.op] + 1)).join(SYMBOL[e.op]);
    case 'implies':
      // right-associative: a -> b -> c is a -> (b -> c)
      return `${wrap(e.left, PREC.implies + 1)} -> ${wrap(e.right, PREC.implies)}`;
    case 'iff':
      return `${wrap(e.left, PREC.iff + 1)} <-> ${wrap(e.right, PREC.iff + 1)}`;
  }
}

/** Replaces variables by expressions (variables without a replacement stay). */
export function substitute(e: Expr, f: (name: string) => Expr | undefined): Expr {
  switch (e.op) {
    case 'const':
      return e;
    case 'var':
      return f(e.name) ?? e;
    case 'not':
      return not(substitute(e.arg, f));
    case 'and':
      return and(...e.args.map((a) => substitute(a, f)));
    case 'or':
      return or(...e.args.map((a) => substitute(a, f)));
    case 'xor':
      return xor(...e.args.map((a) => substitute(a, f)));
    case 'implies':
      return implies(substitute(e.left, f), substitute(e.right, f));
    case 'iff':
      return iff(substitute(e.left, f), substitute(e.right, f));
  }
}

/** Structural equality (same tree, same order). */
export function exprEquals(a: Expr, b: Expr): boolean {
  return exprToString(a) === exprToString(b);
}

/** Number of nodes in the tree, for guarding against blow-up when composing functions. */
export function exprSize(e: Expr): number {
  switch (e.op) {
    case 'const':
    case 'var':
      return 1;
    case 'not':
      return 1 + exprSize(e.arg);
    case 'and':
    case 'or':
    case 'xor':
      return e.args.reduce((n, a) => n + exprSize(a), 1);
    case 'implies':
    case 'iff':
      return 1 + exprSize(e.left) + exprSize(e.right);
  }
}
