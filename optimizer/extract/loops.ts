// Storage found in the logic view: strongly connected nets (Tarjan, iterative so a million nets
// cannot overflow the stack). Two inverting nets feeding each other are a latch (a cross-coupled
// pair); any other loop is cut the same way and reported.
import type { LogicNode } from './types';
import type { Diagnostic } from '../errors';

function isInverting(n: LogicNode): boolean {
  return n.fn.op === 'not';
}

/**
 * Each node's fan-in as node indices (inputs that are not nodes left out), in `inputs` order.
 * `nodeOf` gives the node a name drives, -1 for none.
 */
export function successors(nodes: LogicNode[], nodeOf: (name: string) => number, notNodes?: (name: string) => void): number[][] {
  const succ: number[][] = new Array(nodes.length);
  for (let i = 0; i < nodes.length; i++) {
    const list: number[] = [];
    const inputs = nodes[i].inputs;
    for (let k = 0; k < inputs.length; k++) {
      const nm = inputs[k];
      const x = nodeOf(nm);
      if (x >= 0) list.push(x);
      else notNodes?.(nm);
    }
    succ[i] = list;
  }
  return succ;
}

/** Marks latch nets in place; returns the diagnostics for loops that are not simple latches. */
export function markLoops(nodes: LogicNode[], succ: number[][]): Diagnostic[] {
  const n = nodes.length;
  const index = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const onStack = new Uint8Array(n);
  const stack: number[] = [];
  const diags: Diagnostic[] = [];
  let counter = 0;
  // The walk's frames as two parallel lists (vertex, next successor) and a one-node component
  // without a list of its own: a million nodes, nearly all alone in their component, would
  // otherwise leave a pair and a list each behind as garbage.
  const workV: number[] = [];
  const workI: number[] = [];
  for (let root = 0; root < n; root++) {
    if (index[root] >= 0) continue;
    workV.push(root);
    workI.push(0);
    while (workV.length) {
      const t = workV.length - 1;
      const vtx = workV[t];
      const i = workI[t];
      if (i === 0) {
        index[vtx] = low[vtx] = counter++;
        stack.push(vtx);
        onStack[vtx] = 1;
      }
      if (i < succ[vtx].length) {
        workI[t] = i + 1;
        const w = succ[vtx][i];
        if (index[w] < 0) {
          workV.push(w);
          workI.push(0);
        } else if (onStack[w]) low[vtx] = Math.min(low[vtx], index[w]);
        continue;
      }
      workV.pop();
      workI.pop();
      if (workV.length) {
        const parent = workV[workV.length - 1];
        low[parent] = Math.min(low[parent], low[vtx]);
      }
      if (low[vtx] === index[vtx]) {
        if (stack[stack.length - 1] === vtx) {
          stack.pop();
          onStack[vtx] = 0;
          classifyAlone(nodes, vtx, succ, diags);
          continue;
        }
        const comp: number[] = [];
        let w: number;
        do {
          w = stack.pop()!;
          onStack[w] = 0;
          comp.push(w);
        } while (w !== vtx);
        classify(nodes, comp, succ, diags);
      }
    }
  }
  return diags;
}

/** A component of one node: a latch only when the node feeds itself. */
function classifyAlone(nodes: LogicNode[], only: number, succ: number[][], diags: Diagnostic[]): void {
  if (succ[only].includes(only) && nodes[only].kind !== 'latch') {
    nodes[only].kind = 'latch';
    diags.push({ severity: 'warning', code: 'extract.loop', message: `net ${nodes[only].name} feeds back to itself; treated as a stored state bit` });
  }
}

function classify(nodes: LogicNode[], comp: number[], succ: number[][], diags: Diagnostic[]): void {
  if (comp.length === 1) return classifyAlone(nodes, comp[0], succ, diags);
  if (comp.length === 2 && comp.every((i) => isInverting(nodes[i]))) {
    const [a, b] = comp;
    nodes[a].kind = 'latch';
    nodes[b].kind = 'latch';
    nodes[a].partner = nodes[b].net;
    nodes[b].partner = nodes[a].net;
    return;
  }
  for (const i of comp) nodes[i].kind = 'latch';
  diags.push({
    severity: 'warning',
    code: 'extract.loop',
    message: `feedback loop through ${comp.length} nets (${comp
      .slice(0, 6)
      .map((i) => nodes[i].name)
      .join(', ')}${comp.length > 6 ? ', …' : ''}) is not a simple cross-coupled pair; its nets are treated as stored state bits`,
  });
}
