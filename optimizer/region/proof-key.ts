// Canonical key of a proposal's proof: the cut-out region before and after the edit, with nets,
// instance paths and sources numbered by position and net names reduced to the order they sort in,
// so a region repeated in every slice of a design is proved once and the verdict reused.
import { support, type Expr } from '../logic/expr';
import type { FlatNetlist } from '../netlist/ir';

/** Regions above this many devices are not keyed: they are unique and keying them costs time. */
export const MAX_KEYED_DEVICES = 4000;

/** Suffixes the proof appends to net names (tri-state enables, next state) and then sorts with them. */
const SUFFIXES = ['@en', '@next'];

export interface ProofKey {
  key: string;
  /** Net and variable names by their position in the key; two equal keys pair names by position. */
  names: string[];
}

/** Name → position map of a key (built once per cached entry, when it is first reused). */
export function positions(key: ProofKey): Map<string, number> {
  return new Map(key.names.map((n, i) => [n, i]));
}

function exprKey(e: Expr, pos: (name: string) => number, out: string[]): void {
  switch (e.op) {
    case 'const':
      out.push(e.value ? '1' : '0');
      return;
    case 'var':
      out.push(`v${pos(e.name)}`);
      return;
    case 'not':
      out.push('!(');
      exprKey(e.arg, pos, out);
      out.push(')');
      return;
    case 'implies':
    case 'iff':
      out.push(`${e.op}(`);
      exprKey(e.left, pos, out);
      out.push(',');
      exprKey(e.right, pos, out);
      out.push(')');
      return;
    default:
      out.push(`${e.op}(`);
      for (const a of e.args) {
        exprKey(a, pos, out);
        out.push(',');
      }
      out.push(')');
  }
}

/**
 * Devices in order (kind, operation, model, value, waveform, parameters, terminal net ids, instance
 * path class), net kinds, rails with their source's position and ports. Net ids are the region's
 * own: two regions cut the same way from two slices number their nets alike, and every step of the
 * proof walks devices and nets by index, so equal text means the same walk.
 */
function netlistKey(nl: FlatNetlist, pathClass: Map<string, number>, out: string[]): void {
  out.push(`N${nl.nets.length}D${nl.devices.length}`);
  for (const n of nl.nets) if (n.kind) out.push(`k${n.id}=${n.kind}`);
  const sourceAt = new Map<string, number>();
  for (const r of nl.rails) if (r.source !== undefined) sourceAt.set(r.source, -1);
  nl.devices.forEach((d, i) => {
    if (sourceAt.has(d.name)) sourceAt.set(d.name, i);
    const path = d.path.join('.');
    let pc = pathClass.get(path);
    if (pc === undefined) pathClass.set(path, (pc = pathClass.size));
    out.push(
      `${d.kind}|${d.op ?? ''}|${d.model ?? ''}|${d.value ?? ''}|${d.waveform ?? ''}|${JSON.stringify(d.params)}|${d.terminals.join(',')}|p${pc}`,
    );
  });
  for (const r of nl.rails) out.push(`r${r.net}:${r.volts}:${r.source === undefined ? '' : sourceAt.get(r.source)}`);
  out.push(`ports:${nl.ports.join(',')}`);
}

/**
 * @param before the region cut out of the design
 * @param after the region with the edit applied
 * @param changed names of the nets the edit changes (the proof's candidates for comparison)
 * @param assumptions the assumptions the proposal relies on, in order
 * @param extra anything else the proof depends on (settings), as text
 * @param cut driven nets the proof takes as free values (a region cut at unchanged nets)
 * @returns the key, or undefined when the region is too large to be worth keying
 */
export function proofKey(
  before: FlatNetlist,
  after: FlatNetlist,
  changed: readonly string[],
  assumptions: readonly { expr: Expr }[],
  extra: string,
  cut: readonly string[] = [],
): ProofKey | undefined {
  if (before.devices.length > MAX_KEYED_DEVICES || after.devices.length > MAX_KEYED_DEVICES) return undefined;
  const out: string[] = [extra];
  const pathClass = new Map<string, number>();
  netlistKey(before, pathClass, out);
  out.push('=>');
  netlistKey(after, pathClass, out);
  // Models: within one design a model name always means the same model; an edit may add new ones.
  for (const [name, m] of Object.entries(after.models)) if (before.models[name] !== m) out.push(`model ${name}=${JSON.stringify(m)}`);

  // Every name the proof can see, with what it denotes; names outside both regions (assumption
  // variables, nets of the wider design) are told apart by first appearance.
  const varSet = new Set<string>();
  for (const a of assumptions) support(a.expr, varSet);
  const vars = [...varSet];
  const all = new Set<string>([...before.netByName.keys(), ...after.netByName.keys(), ...changed, ...cut, ...vars]);
  const outside = new Map<string, number>();
  for (const n of [...changed, ...vars]) if (!before.netByName.has(n) && !after.netByName.has(n) && !outside.has(n)) outside.set(n, outside.size);
  const token = (name: string): string => {
    const b = before.netByName.get(name);
    const a = after.netByName.get(name);
    const bPrimary = b !== undefined && before.nets[b].name === name ? 1 : 0;
    const aPrimary = a !== undefined && after.nets[a].name === name ? 1 : 0;
    return `${b ?? '-'}/${a ?? '-'}/${bPrimary}${aPrimary}/${outside.get(name) ?? ''}`;
  };
  // The proof sorts names (and names with its suffixes) to order inputs and outputs: the key holds
  // that order, so equal keys sort alike and give the same vectors and the same counterexample.
  const entries: { text: string; base: string; suffix: number }[] = [];
  for (const n of all) {
    entries.push({ text: n, base: n, suffix: -1 });
    SUFFIXES.forEach((s, k) => entries.push({ text: n + s, base: n, suffix: k }));
  }
  entries.sort((x, y) => (x.text < y.text ? -1 : x.text > y.text ? 1 : x.suffix - y.suffix));
  const names: string[] = [];
  const position = new Map<string, number>();
  const order: string[] = [];
  for (const e of entries) {
    if (e.suffix < 0) {
      position.set(e.base, names.length);
      names.push(e.base);
    }
  }
  for (const e of entries) order.push(e.suffix < 0 ? `${position.get(e.base)}=${token(e.base)}` : `${position.get(e.base)}${SUFFIXES[e.suffix]}`);
  out.push(`names:${order.join(' ')}`);
  const pos = (name: string) => position.get(name)!;
  out.push(`changed:${changed.map(pos).join(',')}`);
  if (cut.length) out.push(`cut:${cut.map(pos).join(',')}`);
  for (const a of assumptions) {
    const parts: string[] = ['assume '];
    exprKey(a.expr, pos, parts);
    out.push(parts.join(''));
  }
  return { key: out.join('\n'), names };
}
