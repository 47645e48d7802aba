// The parsed form of structural Verilog: module declarations and net expressions, plus the
// value of sized and unsized constants as bit strings.
import type { VTok } from './lexer';

export interface Range {
  msb: number;
  lsb: number;
}

export type Expr =
  | { k: 'id'; name: string; tok: VTok }
  | { k: 'bit'; name: string; index: number; tok: VTok }
  | { k: 'slice'; name: string; msb: number; lsb: number; tok: VTok }
  | { k: 'const'; bits: string; tok: VTok }
  | { k: 'concat'; parts: Expr[]; tok: VTok }
  | { k: 'not'; a: Expr; tok: VTok }
  | { k: 'bin'; op: '&' | '|' | '^' | '~^'; a: Expr; b: Expr; tok: VTok }
  | { k: 'cond'; c: Expr; a: Expr; b: Expr; tok: VTok };

export type Dir = 'input' | 'output' | 'inout';
export type NetKind = 'wire' | 'tri' | 'wand' | 'wor' | 'supply0' | 'supply1';

export interface ModuleDecl {
  name: string;
  tok: VTok;
  headerPorts: { name: string; tok: VTok }[];
  portDecls: Map<string, { dir: Dir; range?: Range; tok: VTok }>;
  nets: Map<string, { kind: NetKind; range?: Range; tok: VTok }>;
  gates: { prim: string; name?: string; terms: Expr[]; tok: VTok }[];
  assigns: { lhs: Expr; rhs: Expr; tok: VTok }[];
  pulls: { op: 'pullup' | 'pulldown'; name?: string; net: Expr; tok: VTok }[];
  insts: { cell: string; name: string; positional?: Expr[]; named?: Map<string, { expr: Expr | null; tok: VTok }>; tok: VTok }[];
}

export interface ParseProblem {
  severity: 'error' | 'warning';
  message: string;
  tok: VTok;
}

/** Bits of a constant (0 1 x z), most significant first; undefined when it cannot be read. */
export function constBits(t: VTok): string | undefined {
  const s = t.text.replace(/_/g, '');
  const m = /^(\d*)'[sS]?([bBoOdDhH])([0-9a-fA-FxXzZ?]+)$/.exec(s);
  let width: number;
  let bits: string;
  if (!m) {
    if (!/^\d+$/.test(s)) return undefined;
    const v = BigInt(s);
    width = 32;
    bits = v.toString(2);
  } else {
    width = m[1] ? Number(m[1]) : 32;
    const base = m[2].toLowerCase();
    const digits = m[3].toLowerCase().replace(/\?/g, 'z');
    const per = base === 'b' ? 1 : base === 'o' ? 3 : base === 'h' ? 4 : 0;
    if (per === 0) {
      if (!/^\d+$/.test(digits)) return undefined;
      bits = BigInt(digits).toString(2);
    } else {
      const radix = per === 1 ? 2 : per === 3 ? 8 : 16;
      bits = [...digits]
        .map((d) => {
          if (d === 'x' || d === 'z') return d.repeat(per);
          const v = parseInt(d, radix);
          return Number.isNaN(v) ? 'NaN' : v.toString(2).padStart(per, '0');
        })
        .join('');
      if (/[^01xz]/.test(bits) || bits.includes('NaN')) return undefined;
    }
  }
  if (width < 1 || width > 4096) return undefined;
  const pad = bits[0] === 'x' || bits[0] === 'z' ? bits[0] : '0';
  return bits.length >= width ? bits.slice(bits.length - width) : pad.repeat(width - bits.length) + bits;
}

