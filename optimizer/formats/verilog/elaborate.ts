// Turns parsed modules into IR cells: vectors bit-blasted to NAME[i], gate primitives and pullups
// to gate devices, each `assign` operator to one gate named from the assign's line, constants to
// supply nets, and module instances to bit-level connections (positional or by port name).
import { dict } from '../../netlist/own';
import type { Cell, Device, GateOp, SourceLoc } from '../../netlist/ir';
import type { Expr, ModuleDecl, Range } from './parse';
import type { VTok } from './lexer';

export const CONST0 = "1'b0";
export const CONST1 = "1'b1";

export interface Problem {
  severity: 'error' | 'warning';
  message: string;
  tok: VTok;
}

class Skip extends Error {}
class Exhausted extends Error {}

function rangeBits(name: string, r: Range | undefined): string[] {
  if (!r) return [name];
  const out: string[] = [];
  const step = r.msb >= r.lsb ? -1 : 1;
  for (let i = r.msb; ; i += step) {
    out.push(`${name}[${i}]`);
    if (i === r.lsb) break;
  }
  return out;
}

function inRange(r: Range, i: number): boolean {
  return i >= Math.min(r.msb, r.lsb) && i <= Math.max(r.msb, r.lsb);
}

/**
 * Bit-blasting multiplies: a short file of wide vectors can describe billions of bits. Every net
 * bit, connection bit and gate made is counted against `budget`, and elaboration stops with a
 * clear message when it runs out instead of exhausting memory.
 */
export function elaborate(mods: ModuleDecl[], loc: (t: VTok) => SourceLoc, problems: Problem[], budget: number): Record<string, Cell> {
  let spent = 0;
  const spend = (n: number, tok: VTok) => {
    spent += n;
    if (spent > budget) {
      problems.push({ severity: 'error', message: `the design expands to more than ${budget.toLocaleString('en-US')} gates and net bits; the limit is ${budget.toLocaleString('en-US')}`, tok });
      throw new Exhausted();
    }
  };
  const bitsOfRange = (name: string, r: Range | undefined, tok: VTok) => {
    spend(r ? Math.abs(r.msb - r.lsb) + 1 : 1, tok);
    return rangeBits(name, r);
  };
  try {
    return elaborateAll();
  } catch (e) {
    if (e instanceof Exhausted) return {};
    throw e;
  }

  function elaborateAll(): Record<string, Cell> {
  const byName = new Map(mods.map((m) => [m.name, m]));
  const cells = dict<Cell>();
  const portGroups = new Map<string, { name: string; bits: string[] }[]>();
  for (const m of mods) {
    const groups = m.headerPorts.map((hp) => {
      const decl = m.portDecls.get(hp.name);
      if (!decl) problems.push({ severity: 'error', message: `port ${hp.name} of module ${m.name} has no input/output/inout declaration`, tok: hp.tok });
      return { name: hp.name, bits: bitsOfRange(hp.name, decl?.range, hp.tok) };
    });
    for (const [name, d] of m.portDecls) {
      if (!m.headerPorts.some((h) => h.name === name)) problems.push({ severity: 'error', message: `${name} is declared ${d.dir} but is not in the port list of ${m.name}`, tok: d.tok });
    }
    portGroups.set(m.name, groups);
  }
  for (const m of mods) {
    if (Object.hasOwn(cells, m.name)) {
      problems.push({ severity: 'error', message: `module ${m.name} is defined twice`, tok: m.tok });
      continue;
    }
    cells[m.name] = module(m);
  }
  return cells;

  function module(m: ModuleDecl): Cell {
    const devices: Device[] = [];
    const cell: Cell = { name: m.name, ports: [], devices, instances: [], loc: loc(m.tok) };
    const directions = dict<'input' | 'output' | 'inout'>();
    for (const g of portGroups.get(m.name)!) {
      const dir = m.portDecls.get(g.name)?.dir ?? 'inout';
      for (const b of g.bits) {
        cell.ports.push(b);
        directions[b] = dir;
      }
    }
    cell.directions = directions;
    const netKinds = dict<NonNullable<Cell['netKinds']>[string]>();
    for (const [name, n] of m.nets) if (n.kind !== 'wire') for (const b of bitsOfRange(name, n.range, n.tok)) netKinds[b] = n.kind;
    const rangeOf = (name: string) => m.nets.get(name)?.range ?? m.portDecls.get(name)?.range;
    let counter = 0;
    const fail = (message: string, tok: VTok): never => {
      problems.push({ severity: 'error', message, tok });
      throw new Skip();
    };
    const useConst = (bit: '0' | '1') => {
      const n = bit === '1' ? CONST1 : CONST0;
      netKinds[n] = bit === '1' ? 'supply1' : 'supply0';
      return n;
    };
    const gate = (name: string, op: GateOp, terminals: string[], tok: VTok) => spend(1, tok) ?? devices.push({ name, kind: 'gate', op, terminals, params: {}, loc: loc(tok) });

    /** Bits of a net expression (no operators), most significant first. */
    const bitsOf = (e: Expr, width?: number): string[] => {
      switch (e.k) {
        case 'id':
          return bitsOfRange(e.name, rangeOf(e.name), e.tok);
        case 'bit': {
          const r = rangeOf(e.name);
          if (!r || !inRange(r, e.index)) fail(`${e.name}[${e.index}] is outside the declared range of ${e.name}`, e.tok);
          return [`${e.name}[${e.index}]`];
        }
        case 'slice': {
          const r = rangeOf(e.name);
          if (!r || !inRange(r, e.msb) || !inRange(r, e.lsb)) fail(`${e.name}[${e.msb}:${e.lsb}] is outside the declared range of ${e.name}`, e.tok);
          return bitsOfRange(e.name, { msb: e.msb, lsb: e.lsb }, e.tok);
        }
        case 'const': {
          let bits = e.bits;
          if (width !== undefined) bits = bits.length >= width ? bits.slice(bits.length - width) : '0'.repeat(width - bits.length) + bits;
          if (/[xz]/.test(bits)) fail('x and z constants are only supported as the tri-state branch of ?:', e.tok);
          return [...bits].map((b) => useConst(b as '0' | '1'));
        }
        case 'concat':
          return e.parts.flatMap((x) => operand(x));
        default:
          return operand(e, width);
      }
    };
    const isSimple = (e: Expr) => e.k === 'id' || e.k === 'bit' || e.k === 'slice' || e.k === 'const' || e.k === 'concat';
    const fresh = (line: number, width: number) => Array.from({ length: width }, () => `_a${line}_n${++counter}`);
    const gname = (line: number, op: string) => `_a${line}_${op}${++counter}`;
    const same = (a: string[], b: string[], tok: VTok) => {
      if (a.length !== b.length) fail(`width mismatch: ${a.length} bits against ${b.length} bits`, tok);
    };
    /** Width an expression has on its own (undefined for unsized constants), without building gates. */
    const widthHint = (e: Expr): number | undefined => {
      switch (e.k) {
        case 'id': {
          const r = rangeOf(e.name);
          return r ? Math.abs(r.msb - r.lsb) + 1 : 1;
        }
        case 'bit':
          return 1;
        case 'slice':
          return Math.abs(e.msb - e.lsb) + 1;
        case 'const':
          return undefined;
        case 'concat':
          return e.parts.reduce((n, x) => n + (x.k === 'const' ? x.bits.length : (widthHint(x) ?? 1)), 0);
        case 'not':
          return widthHint(e.a);
        case 'bin':
        case 'cond':
          return widthHint(e.a) ?? widthHint(e.b);
      }
    };

    /** Compiles an expression to gates; writes the result onto `target` bits when given. */
    function operand(e: Expr, width?: number, target?: string[]): string[] {
      const line = e.tok.line;
      if (isSimple(e)) {
        const bits = bitsOf(e, width ?? target?.length);
        if (!target) return bits;
        same(target, bits, e.tok);
        bits.forEach((b, i) => gate(gname(line, 'buf'), 'buf', [target[i], b], e.tok));
        return target;
      }
      if (e.k === 'not') {
        const a = operand(e.a, width ?? target?.length);
        const out = target ?? fresh(line, a.length);
        same(out, a, e.tok);
        a.forEach((b, i) => gate(gname(line, 'not'), 'not', [out[i], b], e.tok));
        return out;
      }
      if (e.k === 'bin') {
        const w = width ?? target?.length ?? widthHint(e.a) ?? widthHint(e.b);
        const a = operand(e.a, w);
        const b = operand(e.b, a.length);
        same(a, b, e.tok);
        const out = target ?? fresh(line, a.length);
        same(out, a, e.tok);
        const op: GateOp = e.op === '&' ? 'and' : e.op === '|' ? 'or' : e.op === '^' ? 'xor' : 'xnor';
        a.forEach((x, i) => gate(gname(line, op), op, [out[i], x, b[i]], e.tok));
        return out;
      }
      if (e.k === 'cond') {
        const c = operand(e.c);
        if (c.length !== 1) fail(`the condition of ?: must be one bit, found ${c.length}`, e.tok);
        const isZ = (x: Expr) => x.k === 'const' && /^z+$/.test(x.bits);
        if (isZ(e.a) || isZ(e.b)) {
          const data = isZ(e.b) ? e.a : e.b;
          const d = operand(data, width ?? target?.length);
          const out = target ?? fresh(line, d.length);
          same(out, d, e.tok);
          const op: GateOp = isZ(e.b) ? 'bufif1' : 'bufif0';
          d.forEach((x, i) => gate(gname(line, op), op, [out[i], x, c[0]], e.tok));
          return out;
        }
        const w = width ?? target?.length ?? widthHint(e.a) ?? widthHint(e.b);
        const a = operand(e.a, w);
        const b = operand(e.b, a.length);
        same(a, b, e.tok);
        const out = target ?? fresh(line, a.length);
        same(out, a, e.tok);
        const [nc] = fresh(line, 1);
        gate(gname(line, 'not'), 'not', [nc, c[0]], e.tok);
        a.forEach((x, i) => {
          const [t1, t2] = fresh(line, 2);
          gate(gname(line, 'and'), 'and', [t1, x, c[0]], e.tok);
          gate(gname(line, 'and'), 'and', [t2, b[i], nc], e.tok);
          gate(gname(line, 'or'), 'or', [out[i], t1, t2], e.tok);
        });
        return out;
      }
      return fail('unsupported expression', (e as { tok: VTok }).tok);
    }

    const one = (e: Expr): string => {
      const b = bitsOf(e);
      if (b.length !== 1) fail(`a gate terminal must be one bit, found ${b.length}`, e.tok);
      return b[0];
    };

    for (const g of m.gates) {
      try {
        const base = g.name ?? `_g${g.tok.line}_${g.prim}${++counter}`;
        const terms = g.terms.map(one);
        if (g.prim === 'not' || g.prim === 'buf') {
          if (terms.length < 2) fail(`${g.prim} needs an output and an input`, g.tok);
          const input = terms[terms.length - 1];
          terms.slice(0, -1).forEach((o, k) => gate(k === 0 ? base : `${base}_${k + 1}`, g.prim as GateOp, [o, input], g.tok));
        } else if (g.prim.includes('if')) {
          if (terms.length !== 3) fail(`${g.prim} needs output, data and enable`, g.tok);
          gate(base, g.prim as GateOp, terms, g.tok);
        } else {
          if (terms.length < 3) fail(`${g.prim} needs an output and at least two inputs`, g.tok);
          gate(base, g.prim as GateOp, terms, g.tok);
        }
      } catch (e) {
        if (!(e instanceof Skip)) throw e;
      }
    }
    for (const p of m.pulls) {
      try {
        bitsOf(p.net).forEach((b, k) => gate(p.name ? (k === 0 ? p.name : `${p.name}_${k + 1}`) : `_${p.op}${p.tok.line}_${++counter}`, p.op, [b], p.tok));
      } catch (e) {
        if (!(e instanceof Skip)) throw e;
      }
    }
    for (const a of m.assigns) {
      try {
        if (a.lhs.k === 'const' || !isSimple(a.lhs)) fail('the left side of assign must be nets', a.lhs.tok);
        const target = bitsOf(a.lhs);
        operand(a.rhs, undefined, target);
      } catch (e) {
        if (!(e instanceof Skip)) throw e;
      }
    }
    for (const inst of m.insts) {
      try {
        const child = byName.get(inst.cell);
        if (!child) fail(`unknown module ${inst.cell} (used by ${inst.name})`, inst.tok);
        const groups = portGroups.get(inst.cell)!;
        const conns: string[] = [];
        const connect = (g: { name: string; bits: string[] }, e: Expr | null | undefined) => {
          if (!e) {
            for (let k = 0; k < g.bits.length; k++) conns.push(`${inst.name}__${g.name}_nc${g.bits.length > 1 ? k : ''}`);
            return;
          }
          const bits = isSimple(e) ? bitsOf(e, g.bits.length) : operand(e, g.bits.length);
          if (bits.length !== g.bits.length) fail(`port ${g.name} of ${inst.cell} is ${g.bits.length} bits wide; ${inst.name} connects ${bits.length}`, e.tok);
          conns.push(...bits);
        };
        if (inst.positional) {
          if (inst.positional.length > groups.length) fail(`${inst.name} connects ${inst.positional.length} ports but module ${inst.cell} has ${groups.length}`, inst.tok);
          groups.forEach((g, k) => connect(g, inst.positional![k]));
        } else {
          for (const [port, c] of inst.named!) if (!groups.some((g) => g.name === port)) fail(`module ${inst.cell} has no port ${port}`, c.tok);
          for (const g of groups) connect(g, inst.named!.get(g.name)?.expr);
        }
        cell.instances.push({ name: inst.name, cell: inst.cell, connections: conns, params: {}, loc: loc(inst.tok) });
      } catch (e) {
        if (!(e instanceof Skip)) throw e;
      }
    }
    if (Object.keys(netKinds).length > 0) cell.netKinds = netKinds;
    // Devices in file order (primitives, pullups and assign gates interleaved as written).
    const at = (d: Device) => d.loc?.line ?? 0;
    devices.sort((a, b) => at(a) - at(b));
    return cell;
  }
  }
}
