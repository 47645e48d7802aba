// Classes of driven nets that compute the same function of the same nets (one enable inverter per
// bit slice, duplicated decode gates): keyed by family, sorted inputs and truth table, so operand
// order and expression shape do not matter. Linear in the view; shared by rules that share drivers.
import { evaluate, type Expr } from '../../logic/expr';
import type { Family, LogicNode, LogicView, NodeKind } from '../../extract/types';

export interface FunctionClass {
  /** family | inputs | truth table — equal keys mean equal functions of equal nets. */
  key: string;
  family: Family;
  /** Sorted names of the nets the function reads. */
  inputs: string[];
  /** The function as the first member computes it. */
  fn: Expr;
  /** Indices into view.nodes, in design order. */
  members: number[];
}

export interface SameFunctionOptions {
  /** Largest input count compared (truth tables of 2^n rows). */
  maxInputs: number;
  /** Node kinds that may be members (default: statically driven nets only). */
  kinds?: NodeKind[];
  /** Smallest class reported. */
  minSize?: number;
  /** Extra filter on members (e.g. a device-ownership check). */
  accept?: (node: LogicNode, index: number) => boolean;
}

/** Truth table of `fn` over `inputs` (first input = most significant bit) as a hex string. */
export function truthKey(fn: Expr, inputs: string[]): string {
  const rows = 2 ** inputs.length;
  const env: Record<string, 0 | 1> = {};
  const bits: number[] = [];
  let word = 0;
  for (let m = 0; m < rows; m++) {
    inputs.forEach((n, i) => (env[n] = ((m >> (inputs.length - 1 - i)) & 1) as 0 | 1));
    word = (word << 1) | evaluate(fn, env);
    if ((m & 3) === 3 || m === rows - 1) {
      bits.push(word);
      word = 0;
    }
  }
  return bits.map((b) => b.toString(16)).join('');
}

export function sameFunctionClasses(view: LogicView, options: SameFunctionOptions): FunctionClass[] {
  const kinds = new Set(options.kinds ?? ['static']);
  const byKey = new Map<string, FunctionClass>();
  view.nodes.forEach((node, i) => {
    if (!kinds.has(node.kind) || node.enable) return;
    const inputs = [...node.inputs].sort();
    // Constant nets are another rule's business; wide functions are left to the minimiser.
    if (inputs.length === 0 || inputs.length > options.maxInputs) return;
    if (options.accept && !options.accept(node, i)) return;
    const key = `${node.family}|${inputs.join(',')}|${truthKey(node.fn, inputs)}`;
    const cls = byKey.get(key);
    if (cls) cls.members.push(i);
    else byKey.set(key, { key, family: node.family, inputs, fn: node.fn, members: [i] });
  });
  const min = options.minSize ?? 2;
  return [...byKey.values()].filter((c) => c.members.length >= min);
}

/** How many logic nodes claim each device; a device claimed twice cannot be removed with one node. */
export function deviceOwnerCounts(view: LogicView, deviceCount: number): Uint8Array {
  const counts = new Uint8Array(deviceCount);
  for (const n of view.nodes) for (const d of n.devices) if (counts[d] < 255) counts[d]++;
  return counts;
}
