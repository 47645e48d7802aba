// Three-valued evaluation for switch-level simulation: a value is a mask of what a net can be
// (bit 0: 0, bit 1: 1; 3 = X), so X propagates only where it can change a result.
import type { Expr } from '../logic/expr';
import type { CompiledExpr } from './switch-model';

export type Mask = number;

const invert = (m: Mask): Mask => ((m & 1) << 1) | ((m >> 1) & 1);

function andMasks(ms: Mask[]): Mask {
  let can0 = 0;
  let can1 = 1;
  for (const m of ms) {
    can0 |= m & 1;
    can1 &= (m >> 1) & 1;
  }
  return can0 | (can1 << 1);
}

function orMasks(ms: Mask[]): Mask {
  let can0 = 1;
  let can1 = 0;
  for (const m of ms) {
    can0 &= m & 1;
    can1 |= (m >> 1) & 1;
  }
  return can0 | (can1 << 1);
}

function xorMasks(ms: Mask[]): Mask {
  let r = 1;
  for (const m of ms) {
    if (m === 3 || r === 3) r = 3;
    else if (m === 2) r = r === 1 ? 2 : 1;
  }
  return r;
}

/** Evaluates an expression over net names; `read` gives each net's mask. */
export function ternaryExpr(e: Expr, read: (name: string) => Mask): Mask {
  switch (e.op) {
    case 'const':
      return e.value ? 2 : 1;
    case 'var':
      return read(e.name);
    case 'not':
      return invert(ternaryExpr(e.arg, read));
    case 'and':
      return andMasks(e.args.map((a) => ternaryExpr(a, read)));
    case 'or':
      return orMasks(e.args.map((a) => ternaryExpr(a, read)));
    case 'xor':
      return xorMasks(e.args.map((a) => ternaryExpr(a, read)));
    case 'implies':
      return orMasks([invert(ternaryExpr(e.left, read)), ternaryExpr(e.right, read)]);
    case 'iff':
      return invert(xorMasks([ternaryExpr(e.left, read), ternaryExpr(e.right, read)]));
  }
}

/** Evaluates a control compiled over net ids (the simulator's inner loop). */
export function ternaryCompiled(e: CompiledExpr, read: (net: number) => Mask): Mask {
  switch (e.op) {
    case 'const':
      return e.mask;
    case 'net':
      return read(e.net);
    case 'not':
      return invert(ternaryCompiled(e.arg, read));
    case 'and': {
      if (e.args.length === 1) return ternaryCompiled(e.args[0], read);
      return andMasks(e.args.map((a) => ternaryCompiled(a, read)));
    }
    case 'or': {
      if (e.args.length === 1) return ternaryCompiled(e.args[0], read);
      return orMasks(e.args.map((a) => ternaryCompiled(a, read)));
    }
    case 'xor':
      return xorMasks(e.args.map((a) => ternaryCompiled(a, read)));
  }
}
