// Tokens of structural Verilog (IEEE 1364): identifiers (escaped ones too), numbers (sized
// literals like 1'b0 kept whole), operators and punctuation, each with line and column.
// Comments // and /* */ are skipped; `timescale is ignored; other directives are reported.

export type TokKind = 'id' | 'num' | 'op' | 'eof';

export interface VTok {
  kind: TokKind;
  text: string;
  line: number;
  col: number;
}

export interface LexProblem {
  message: string;
  line: number;
  col: number;
}

const OPS3 = ['~^', '^~', '~&', '~|', '&&', '||', '==', '!=', '<=', '>=', '<<', '>>'];
const SINGLE = '()[]{},;:.#=&|^~!?@+-*/%<>';

export function lexVerilog(text: string, problems: LexProblem[]): VTok[] {
  const toks: VTok[] = [];
  let i = 0;
  let line = 1;
  let lineStart = 0;
  const n = text.length;
  while (i < n) {
    const c = text[i];
    if (c === '\n') {
      line++;
      i++;
      lineStart = i;
      continue;
    }
    if (c === ' ' || c === '\t' || c === '\r' || c === '\f' || c === '\v') {
      i++;
      continue;
    }
    const col = i - lineStart + 1;
    if (c === '/' && text[i + 1] === '/') {
      while (i < n && text[i] !== '\n') i++;
      continue;
    }
    if (c === '/' && text[i + 1] === '*') {
      const end = text.indexOf('*/', i + 2);
      if (end < 0) {
        problems.push({ message: 'unterminated /* comment', line, col });
        break;
      }
      for (let k = i; k < end; k++) if (text[k] === '\n') {
        line++;
        lineStart = k + 1;
      }
      i = end + 2;
      continue;
    }
    if (c === '`') {
      const m = /^`([A-Za-z_]\w*)/.exec(text.slice(i, i + 64));
      const name = m ? m[1] : '';
      if (name !== 'timescale' && name !== 'celldefine' && name !== 'endcelldefine' && name !== 'default_nettype') {
        problems.push({ message: `compiler directive \`${name} is not supported`, line, col });
      }
      while (i < n && text[i] !== '\n') i++;
      continue;
    }
    if (c === '\\') {
      let k = i + 1;
      while (k < n && !/\s/.test(text[k])) k++;
      if (k === i + 1) problems.push({ message: 'empty escaped identifier', line, col });
      else toks.push({ kind: 'id', text: text.slice(i + 1, k), line, col });
      i = k;
      continue;
    }
    if (/[A-Za-z_$]/.test(c)) {
      let k = i + 1;
      while (k < n && /[A-Za-z0-9_$]/.test(text[k])) k++;
      toks.push({ kind: 'id', text: text.slice(i, k), line, col });
      i = k;
      continue;
    }
    if (/[0-9']/.test(c)) {
      const m = /^(?:\d[\d_]*)?(?:\s*'[sS]?[bBoOdDhH]\s*[0-9a-fA-FxXzZ?_]+)?/.exec(text.slice(i, i + 200));
      const len = m && m[0].length > 0 ? m[0].length : 1;
      const t = text.slice(i, i + len);
      if (t === "'") problems.push({ message: "stray '", line, col });
      else toks.push({ kind: 'num', text: t.replace(/\s+/g, ''), line, col });
      i += len;
      continue;
    }
    const two = text.slice(i, i + 2);
    if (OPS3.includes(two)) {
      toks.push({ kind: 'op', text: two, line, col });
      i += 2;
      continue;
    }
    if (SINGLE.includes(c)) {
      toks.push({ kind: 'op', text: c, line, col });
      i++;
      continue;
    }
    problems.push({ message: `unexpected character '${c}'`, line, col });
    i++;
  }
  toks.push({ kind: 'eof', text: '', line, col: i - lineStart + 1 });
  return toks;
}
