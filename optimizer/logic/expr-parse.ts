// Parser for the assumption language: `!` `&` `^` `|` `->` `<->`, parentheses, constants 0/1 and
// net names (hierarchy dots, bus brackets). A hand-written Pratt parser: user text is never
// evaluated as code, and every error carries its line and column.
import { InputError } from '../errors';
import { c, iff, implies, v, type Expr } from './expr';

// The parser keeps the tree as written (no constant folding), flattening only chains of one operator.
const chain = (op: 'and' | 'or' | 'xor', l: Expr, r: Expr): Expr => ({
  op,
  args: [...(l.op === op ? l.args : [l]), r],
});

type TokKind = 'name' | 'const' | 'op' | '(' | ')' | 'end';
interface Token {
  kind: TokKind;
  text: string;
  line: number;
  col: number;
}

const OPS = ['<->', '->', '!', '&', '|', '^', '~'] as const;
// Binding powers; the same order as the printer in expr.ts.
const INFIX: Record<string, { bp: number; right: boolean }> = {
  '<->': { bp: 1, right: false },
  '->': { bp: 2, right: true },
  '|': { bp: 3, right: false },
  '^': { bp: 4, right: false },
  '&': { bp: 5, right: false },
};
const NOT_BP = 6;
const MAX_LENGTH = 100_000;
const MAX_DEPTH = 500;

const isNameStart = (ch: string) => /[A-Za-z_0-9$]/.test(ch);
const isNameChar = (ch: string) => /[A-Za-z_0-9$.#:]/.test(ch);

function tokenize(src: string, file: string): Token[] {
  const toks: Token[] = [];
  let line = 1;
  let lineStart = 0;
  let i = 0;
  const fail = (col: number, msg: string): never => {
    throw InputError.at('assumption.syntax', msg, { file, line, col });
  };
  while (i < src.length) {
    const ch = src[i];
    if (ch === '\n') {
      line++;
      i++;
      lineStart = i;
      continue;
    }
    if (/\s/.test(ch)) {
      i++;
      continue;
    }
    const col = i - lineStart + 1;
    if (ch === '(' || ch === ')') {
      toks.push({ kind: ch, text: ch, line, col });
      i++;
      continue;
    }
    const op = OPS.find((o) => src.startsWith(o, i));
    if (op) {
      toks.push({ kind: 'op', text: op === '~' ? '!' : op, line, col });
      i += op.length;
      continue;
    }
    if (isNameStart(ch)) {
      let j = i;
      while (j < src.length && isNameChar(src[j])) j++;
      // bus brackets: D[3] or XS.D[12]
      while (src[j] === '[') {
        const close = src.indexOf(']', j);
        if (close < 0 || !/^\[\d+\]$/.test(src.slice(j, close + 1))) {
          fail(j - lineStart + 1, `expected a bus index like "[3]" after "${src.slice(i, j)}"`);
        }
        j = close + 1;
        while (j < src.length && isNameChar(src[j])) j++;
      }
      const text = src.slice(i, j);
      if (text.endsWith('.')) fail(j - lineStart, `a net name cannot end with "." ("${text}")`);
      toks.push({ kind: text === '0' || text === '1' ? 'const' : 'name', text, line, col });
      i = j;
      continue;
    }
    fail(col, `unexpected character "${ch}"`);
  }
  toks.push({ kind: 'end', text: '', line, col: i - lineStart + 1 });
  return toks;
}

/**
 * Parses one expression. `file` names the source in error locations ("assumption" by default;
 * the caller passes e.g. "assumption 3" when a design has several).
 */
export function parseExpr(src: string, file = 'assumption'): Expr {
  if (src.length > MAX_LENGTH) {
    throw InputError.at('assumption.too-long', `expression longer than ${MAX_LENGTH} characters`, { file, line: 1, col: 1 });
  }
  const toks = tokenize(src, file);
  let pos = 0;
  const peek = () => toks[pos];
  const fail = (t: Token, msg: string): never => {
    throw InputError.at('assumption.syntax', msg, { file, line: t.line, col: t.col });
  };
  const describe = (t: Token) => (t.kind === 'end' ? 'the end' : `"${t.text}"`);

  const operand = (after: Token | undefined, depth: number): Expr => {
    if (depth > MAX_DEPTH) fail(peek(), `expression nested deeper than ${MAX_DEPTH} levels`);
    const t = toks[pos];
    if (t.kind === 'name') {
      pos++;
      return v(t.text);
    }
    if (t.kind === 'const') {
      pos++;
      return c(t.text === '1' ? 1 : 0);
    }
    if (t.kind === 'op' && t.text === '!') {
      pos++;
      return { op: 'not', arg: expr(NOT_BP, t, depth + 1) };
    }
    if (t.kind === '(') {
      pos++;
      const inner = expr(0, t, depth + 1);
      const close = peek();
      if (close.kind !== ')') fail(close, `expected ")" to close the "(" at column ${t.col}, found ${describe(close)}`);
      pos++;
      return inner;
    }
    const where = after ? ` after "${after.text}"` : t.kind === 'end' && pos === 0 ? ' (the expression is empty)' : '';
    return fail(t, `expected a net name or "("${where}${t.kind === 'end' ? '' : `, found ${describe(t)}`}`);
  };

  const expr = (minBp: number, after: Token | undefined, depth: number): Expr => {
    let left = operand(after, depth);
    for (;;) {
      const t = peek();
      if (t.kind !== 'op') {
        if (t.kind === 'name' || t.kind === 'const' || t.kind === '(') {
          fail(t, `expected an operator (& | ^ -> <->) before ${describe(t)}`);
        }
        break;
      }
      const info = INFIX[t.text];
      if (!info) fail(t, `"${t.text}" cannot follow an operand; expected & | ^ -> or <->`);
      if (info.bp < minBp) break;
      pos++;
      const right = expr(info.right ? info.bp : info.bp + 1, t, depth + 1);
      switch (t.text) {
        case '&':
          left = chain('and', left, right);
          break;
        case '|':
          left = chain('or', left, right);
          break;
        case '^':
          left = chain('xor', left, right);
          break;
        case '->':
          left = implies(left, right);
          break;
        case '<->':
          left = iff(left, right);
          break;
      }
    }
    return left;
  };

  const result = expr(0, undefined, 0);
  const t = peek();
  if (t.kind !== 'end') fail(t, t.kind === ')' ? 'unmatched ")"' : `unexpected ${describe(t)}`);
  return result;
}
