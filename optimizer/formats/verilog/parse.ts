// Parses structural Verilog tokens into module declarations (ports, nets, gate primitives,
// continuous assignments, pullups, module instances). Behavioural code is refused with a located
// error; after an error the parser skips to the next `;` so one pass reports every problem.
import type { VTok } from './lexer';
import { constBits, type Dir, type Expr, type ModuleDecl, type NetKind, type ParseProblem, type Range } from './ast';

export type { Dir, Expr, ModuleDecl, NetKind, ParseProblem, Range } from './ast';

export const PRIMITIVES = new Set(['and', 'or', 'nand', 'nor', 'xor', 'xnor', 'not', 'buf', 'bufif0', 'bufif1', 'notif0', 'notif1']);
const NET_KINDS = new Set(['wire', 'tri', 'wand', 'wor', 'supply0', 'supply1']);
const DIRS = new Set(['input', 'output', 'inout']);
const BEHAVIOURAL = new Set([
  'always', 'initial', 'reg', 'function', 'task', 'integer', 'real', 'realtime', 'time', 'event',
  'begin', 'if', 'case', 'for', 'while', 'forever', 'repeat', 'fork', 'generate', 'genvar',
]);
const UNSUPPORTED = new Set(['parameter', 'localparam', 'defparam', 'specify', 'primitive', 'table', 'trireg', 'tri0', 'tri1', 'triand', 'trior']);

class Bail extends Error {}

export function parseVerilog(toks: VTok[], problems: ParseProblem[]): ModuleDecl[] {
  let p = 0;
  const peek = (o = 0) => toks[Math.min(p + o, toks.length - 1)];
  const next = () => toks[p < toks.length - 1 ? p++ : p];
  const fail = (message: string, tok = peek()): never => {
    problems.push({ severity: 'error', message, tok });
    throw new Bail();
  };
  const expect = (text: string) => (peek().text === text && peek().kind !== 'eof' ? next() : fail(`expected '${text}', found ${show(peek())}`));
  const ident = (what: string) => (peek().kind === 'id' ? next() : fail(`expected ${what}, found ${show(peek())}`));
  const isKw = (text: string) => peek().kind === 'id' && peek().text === text;
  const skipTo = (stops: string[]) => {
    while (peek().kind !== 'eof' && !stops.includes(peek().text)) next();
  };

  const number = (): number => {
    const t = peek();
    if (t.kind !== 'num' || !/^\d+$/.test(t.text.replace(/_/g, ''))) return fail(`expected a whole number, found ${show(t)}`);
    next();
    return Number(t.text.replace(/_/g, ''));
  };
  const range = (): Range | undefined => {
    if (peek().text !== '[') return undefined;
    next();
    const msb = number();
    expect(':');
    const lsb = number();
    expect(']');
    if (Math.abs(msb - lsb) > 4095) fail('vectors wider than 4096 bits are not supported');
    return { msb, lsb };
  };
  const delay = () => {
    if (peek().text !== '#') return;
    problems.push({ severity: 'warning', message: 'delays are ignored (the engine is untimed)', tok: peek() });
    next();
    if (peek().text === '(') {
      let depth = 0;
      do {
        if (peek().text === '(') depth++;
        if (peek().text === ')') depth--;
        if (peek().kind === 'eof') fail('unterminated delay');
        next();
      } while (depth > 0);
    } else next();
  };

  // Expressions: ?: lowest, then |, ^ ~^, &, unary ~ / !, primaries.
  const BAD_OPS = ['&&', '||', '+', '-', '*', '/', '%', '<', '>', '==', '!=', '<<', '>>', '~&', '~|', '<=', '>='];
  const badOp = (t: VTok) => fail(`operator ${t.text} is not supported in assign; use & | ^ ~ and ?:`, t);
  // Nesting is bounded so no input can exhaust the call stack.
  const MAX_NESTING = 200;
  let nesting = 0;
  const expr = (): Expr => {
    if (++nesting > MAX_NESTING) fail(`expression nested more than ${MAX_NESTING} deep`);
    try {
      return exprBody();
    } finally {
      nesting--;
    }
  };
  const exprBody = (): Expr => {
    const c = orExpr();
    if (BAD_OPS.includes(peek().text)) badOp(peek());
    if (peek().text !== '?') return c;
    const tok = next();
    const a = expr();
    expect(':');
    const b = expr();
    return { k: 'cond', c, a, b, tok };
  };
  const orExpr = (): Expr => {
    let a = xorExpr();
    while (peek().text === '|') {
      const tok = next();
      a = { k: 'bin', op: '|', a, b: xorExpr(), tok };
    }
    return a;
  };
  const xorExpr = (): Expr => {
    let a = andExpr();
    while (['^', '~^', '^~'].includes(peek().text)) {
      const tok = next();
      a = { k: 'bin', op: tok.text === '^' ? '^' : '~^', a, b: andExpr(), tok };
    }
    return a;
  };
  const andExpr = (): Expr => {
    let a = unary();
    while (peek().text === '&') {
      const tok = next();
      a = { k: 'bin', op: '&', a, b: unary(), tok };
    }
    return a;
  };
  const unary = (): Expr => {
    const t = peek();
    if (t.text === '~' || t.text === '!') {
      next();
      if (++nesting > MAX_NESTING) fail(`expression nested more than ${MAX_NESTING} deep`);
      try {
        return { k: 'not', a: unary(), tok: t };
      } finally {
        nesting--;
      }
    }
    if (BAD_OPS.includes(t.text)) badOp(t);
    return primary();
  };
  const primary = (): Expr => {
    const t = peek();
    if (t.text === '(') {
      next();
      const e = expr();
      expect(')');
      return e;
    }
    if (t.text === '{') {
      next();
      const parts = [expr()];
      while (peek().text === ',') {
        next();
        parts.push(expr());
      }
      expect('}');
      return { k: 'concat', parts, tok: t };
    }
    if (t.kind === 'num') {
      next();
      return { k: 'const', bits: constBits(t) ?? fail(`unsupported constant ${t.text}`, t), tok: t };
    }
    const id = ident('a net name');
    if (peek().text === '[') {
      next();
      const a = number();
      if (peek().text === ':') {
        next();
        const b = number();
        expect(']');
        return { k: 'slice', name: id.text, msb: a, lsb: b, tok: id };
      }
      expect(']');
      return { k: 'bit', name: id.text, index: a, tok: id };
    }
    return { k: 'id', name: id.text, tok: id };
  };
  const exprList = (): Expr[] => {
    expect('(');
    const list: Expr[] = [];
    if (peek().text !== ')') {
      list.push(expr());
      while (peek().text === ',') {
        next();
        list.push(expr());
      }
    }
    expect(')');
    return list;
  };

  const modules: ModuleDecl[] = [];
  while (peek().kind !== 'eof') {
    if (!isKw('module') && !isKw('macromodule')) {
      try {
        fail(BEHAVIOURAL.has(peek().text) ? 'behavioural code is not supported; structural only' : `expected 'module', found ${show(peek())}`);
      } catch {
        skipTo(['module', 'macromodule']);
        continue;
      }
    }
    const m = parseModule();
    if (m) modules.push(m);
  }
  return modules;

  function parseModule(): ModuleDecl | null {
    const start = next();
    let m: ModuleDecl;
    try {
      const name = ident('a module name');
      m = { name: name.text, tok: name, headerPorts: [], portDecls: new Map(), nets: new Map(), gates: [], assigns: [], pulls: [], insts: [] };
      if (peek().text === '#') fail('module parameters are not supported');
      if (peek().text === '(') {
        next();
        let dir: Dir | undefined;
        let kind: NetKind | undefined;
        let r: Range | undefined;
        while (peek().text !== ')') {
          if (peek().kind === 'id' && DIRS.has(peek().text)) {
            dir = next().text as Dir;
            kind = undefined;
            r = undefined;
            if (peek().kind === 'id' && NET_KINDS.has(peek().text)) kind = next().text as NetKind;
            if (isKw('reg')) fail('behavioural code is not supported; structural only');
            r = range();
          }
          const id = ident('a port name');
          m.headerPorts.push({ name: id.text, tok: id });
          if (dir) {
            m.portDecls.set(id.text, { dir, range: r, tok: id });
            if (kind && kind !== 'wire') m.nets.set(id.text, { kind, range: r, tok: id });
          }
          if (peek().text !== ',') break;
          next();
        }
        expect(')');
      }
      expect(';');
    } catch (e) {
      if (!(e instanceof Bail)) throw e;
      skipTo(['endmodule']);
      next();
      void start;
      return null;
    }
    while (!isKw('endmodule')) {
      if (peek().kind === 'eof') {
        problems.push({ severity: 'error', message: `module ${m.name} has no endmodule`, tok: m.tok });
        return m;
      }
      try {
        item(m);
      } catch (e) {
        if (!(e instanceof Bail)) throw e;
        // Skip the rest of the statement (or a whole begin…end-less behavioural block up to ';').
        skipTo([';', 'endmodule']);
        if (peek().text === ';') next();
      }
    }
    next();
    return m;
  }

  function item(m: ModuleDecl): void {
    const t = peek();
    if (t.kind !== 'id') fail(`unexpected ${show(t)}`);
    const w = t.text;
    if (BEHAVIOURAL.has(w)) fail('behavioural code is not supported; structural only');
    if (UNSUPPORTED.has(w)) fail(`${w} is not supported in structural netlists`);
    if (DIRS.has(w)) {
      next();
      let kind: NetKind | undefined;
      if (peek().kind === 'id' && NET_KINDS.has(peek().text)) kind = next().text as NetKind;
      if (isKw('reg')) fail('behavioural code is not supported; structural only');
      const r = range();
      do {
        const id = ident('a port name');
        m.portDecls.set(id.text, { dir: w as Dir, range: r, tok: id });
        if (kind && kind !== 'wire') m.nets.set(id.text, { kind, range: r, tok: id });
      } while (peek().text === ',' && next());
      expect(';');
      return;
    }
    if (NET_KINDS.has(w)) {
      next();
      delay();
      const r = range();
      do {
        const id = ident('a net name');
        const prev = m.nets.get(id.text);
        if (prev && !m.portDecls.has(id.text)) fail(`net ${id.text} is declared twice`, id);
        m.nets.set(id.text, { kind: w as NetKind, range: r ?? m.portDecls.get(id.text)?.range, tok: id });
        if (peek().text === '=') {
          const eq = next();
          m.assigns.push({ lhs: { k: 'id', name: id.text, tok: id }, rhs: expr(), tok: eq });
        }
      } while (peek().text === ',' && next());
      expect(';');
      return;
    }
    if (w === 'assign') {
      next();
      delay();
      do {
        const lhs = primary();
        const eq = expect('=');
        m.assigns.push({ lhs, rhs: expr(), tok: eq });
      } while (peek().text === ',' && next());
      expect(';');
      return;
    }
    if (w === 'pullup' || w === 'pulldown') {
      next();
      do {
        const name = peek().kind === 'id' ? next().text : undefined;
        const terms = exprList();
        if (terms.length !== 1) fail(`${w} takes one net`, t);
        m.pulls.push({ op: w, name, net: terms[0], tok: t });
      } while (peek().text === ',' && next());
      expect(';');
      return;
    }
    if (PRIMITIVES.has(w)) {
      next();
      if (peek().text === '(' && peek(1).kind === 'id' && /^(strong|weak|pull|supply|highz)[01]$/.test(peek(1).text)) fail('drive strengths are not supported');
      delay();
      do {
        const nameTok = peek().kind === 'id' ? next() : undefined;
        if (peek().text === '[') fail('arrays of instances are not supported');
        const terms = exprList();
        m.gates.push({ prim: w, name: nameTok?.text, terms, tok: nameTok ?? t });
      } while (peek().text === ',' && next());
      expect(';');
      return;
    }
    // Module instance: CELL [#(…)] name (connections) {, name (connections)} ;
    next();
    if (peek().text === '#') fail('parameterised instances are not supported');
    do {
      const name = ident('an instance name');
      if (peek().text === '[') fail('arrays of instances are not supported');
      expect('(');
      const inst: ModuleDecl['insts'][number] = { cell: w, name: name.text, tok: name };
      if (peek().text === '.') {
        inst.named = new Map();
        do {
          expect('.');
          const port = ident('a port name');
          expect('(');
          const e = peek().text === ')' ? null : expr();
          expect(')');
          if (inst.named.has(port.text)) fail(`port ${port.text} is connected twice`, port);
          inst.named.set(port.text, { expr: e, tok: port });
        } while (peek().text === ',' && next());
      } else {
        inst.positional = [];
        if (peek().text !== ')') {
          inst.positional.push(expr());
          while (peek().text === ',') {
            next();
            inst.positional.push(expr());
          }
        }
      }
      expect(')');
      m.insts.push(inst);
    } while (peek().text === ',' && next());
    expect(';');
  }
}

function show(t: VTok): string {
  return t.kind === 'eof' ? 'end of file' : `'${t.text}'`;
}
