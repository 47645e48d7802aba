// Classes of driven nets that compute the same function of the same nets (one enable inverter per
// bit slice, duplicated decode gates): keyed by family, sorted inputs and truth table, so operand
// order and expression shape do not matter. Linear in the view; shared by rules that share drivers.
import { evaluateWords, type Expr } from '../../logic/expr';
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

/** Lane patterns of the five lowest row bits across a 32-row word (lane j holds row 32w + j). */
const LANES = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000].map((x) => x | 0);

/**
 * Truth table of `fn` over `inputs` (first input = most significant bit) as a hex string: one
 * digit per four rows, the first row its high bit. Evaluated 32 rows a pass, bit-parallel.
 */
export function truthKey(fn: Expr, inputs: string[]): string {
  const n = inputs.length;
  const rows = 2 ** n;
  const words = new Map<string, number>();
  let out = '';
  for (let w = 0; w * 32 < rows; w++) {
    inputs.forEach((name, i) => {
      const shift = n - 1 - i;
      words.set(name, shift < 5 ? LANES[shift] : ((w * 32) >> shift) & 1 ? -1 : 0);
    });
    const r = evaluateWords(fn, words);
    const lanes = Math.min(32, rows - w * 32);
    for (let j = 0; j < lanes; j += 4) {
      // rows j … j+3 of this word, the first the most significant (fewer when the table is shorter)
      const width = Math.min(4, lanes - j);
      let digit = 0;
      for (let t = 0; t < width; t++) digit = (digit << 1) | ((r >>> (j + t)) & 1);
      out += digit.toString(16);
    }
  }
  return out;
}

/** A node's sorted inputs and, once asked, its class key. */
interface NodeKey {
  inputs: string[];
  key?: string;
}

/**
 * Sorted inputs and class keys by node index, for a frozen view (as a scan freezes it): they
 * depend only on each node's family, inputs and function, which a frozen view cannot change, and
 * several rules ask for the classes of the same view. One table per view, not one entry per node.
 */
const viewKeys = new WeakMap<LogicView, (NodeKey | undefined)[]>();

function keyTable(view: LogicView): (NodeKey | undefined)[] | undefined {
  if (!Object.isFrozen(view) || !Object.isFrozen(view.nodes)) return undefined;
  let t = viewKeys.get(view);
  if (!t) {
    // filled by push so the array stays packed (a large `new Array(n)` is a slow dictionary)
    t = [];
    for (let i = 0; i < view.nodes.length; i++) t.push(undefined);
    viewKeys.set(view, t);
  }
  return t;
}

export function sameFunctionClasses(view: LogicView, options: SameFunctionOptions): FunctionClass[] {
  const kinds = new Set(options.kinds ?? ['static']);
  const byKey = new Map<string, FunctionClass>();
  const nodes = view.nodes;
  const table = keyTable(view);
  for (let i = 0; i < nodes.length; i++) {
    const node = nodes[i];
    if (!kinds.has(node.kind) || node.enable) continue;
    let nk = table?.[i];
    if (!nk) {
      nk = { inputs: [...node.inputs].sort() };
      // (a node of a frozen view is frozen with it: deepFreeze walks the whole view)
      if (table && Object.isFrozen(node)) table[i] = nk;
    }
    const inputs = nk.inputs;
    // Constant nets are another rule's business; wide functions are left to the minimiser.
    if (inputs.length === 0 || inputs.length > options.maxInputs) continue;
    if (options.accept && !options.accept(node, i)) continue;
    // joined, not a template: a joined string is flat, and a flat key is many times faster to look up
    const key = (nk.key ??= [node.family, inputs.join(','), truthKey(node.fn, inputs)].join('|'));
    const cls = byKey.get(key);
    if (cls) cls.members.push(i);
    else byKey.set(key, { key, family: node.family, inputs: [...inputs], fn: node.fn, members: [i] });
  }
  const min = options.minSize ?? 2;
  return [...byKey.values()].filter((c) => c.members.length >= min);
}

/** How many logic nodes claim each device; a device claimed twice cannot be removed with one node. */
export function deviceOwnerCounts(view: LogicView, deviceCount: number): Uint8Array {
  const counts = new Uint8Array(deviceCount);
  for (const n of view.nodes) for (const d of n.devices) if (counts[d] < 255) counts[d]++;
  return counts;
}
