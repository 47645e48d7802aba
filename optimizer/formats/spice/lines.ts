// Turns deck text into logical cards: comments removed, `+` continuations joined, tokens located
// (line and column from 1). Separators are blanks and commas; `(` `)` `=` are tokens of their own;
// `{…}` and `'…'` stay whole so parameter references keep their braces.

export interface Token {
  text: string;
  line: number;
  col: number;
}

export interface Card {
  tokens: Token[];
  line: number;
  col: number;
  /** Physical lines the card was written on, joined by newlines (for cards kept verbatim). */
  raw: string;
}

export interface TokenizeProblem {
  message: string;
  line: number;
  col: number;
}

const SPACE = 32;
const TAB = 9;
const COMMA = 44;
const CR = 13;
const FF = 12;
const VT = 11;

function isSeparator(c: number): boolean {
  return c === SPACE || c === TAB || c === COMMA || c === CR || c === FF || c === VT;
}

/** Tokenizes one physical line (after comment removal) starting at column offset `from`. */
export function tokenizeLine(text: string, lineNo: number, from: number, out: Token[], problems: TokenizeProblem[]): void {
  const n = text.length;
  let i = from;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (isSeparator(c)) {
      i++;
      continue;
    }
    if (c === 40 || c === 41 || c === 61) {
      // ( ) =
      out.push({ text: text[i], line: lineNo, col: i + 1 });
      i++;
      continue;
    }
    if (c === 123 || c === 39) {
      // { … } or ' … '
      const close = c === 123 ? '}' : "'";
      const end = text.indexOf(close, i + 1);
      if (end < 0) {
        problems.push({ message: `unterminated ${c === 123 ? '{' : "'"} expression`, line: lineNo, col: i + 1 });
        return;
      }
      out.push({ text: text.slice(i, end + 1), line: lineNo, col: i + 1 });
      i = end + 1;
      continue;
    }
    const start = i;
    while (i < n) {
      const d = text.charCodeAt(i);
      if (isSeparator(d) || d === 40 || d === 41 || d === 61 || d === 123) break;
      i++;
    }
    out.push({ text: text.slice(start, i), line: lineNo, col: start + 1 });
  }
}

/** Index of the first non-blank character, or -1 for a blank line. */
function firstNonBlank(s: string): number {
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c !== SPACE && c !== TAB && c !== CR && c !== FF && c !== VT) return i;
  }
  return -1;
}

function stripInlineComment(s: string): string {
  const k = s.indexOf(';');
  return k < 0 ? s : s.slice(0, k);
}

export interface CardVisitor {
  card(card: Card): void;
  /** Raw lines of a `.control` block from the `.control` line through `.endc` (kept verbatim). */
  controlBlock(raw: string, line: number, terminated: boolean): void;
}

/**
 * Walks the deck's cards (line 1, the title, is skipped). `only` filters by the first character of
 * a card so a cheap first pass can look at dot cards alone without tokenizing every element.
 */
export function forEachCard(
  lines: string[],
  visit: CardVisitor,
  problems: TokenizeProblem[],
  only?: (firstChar: string) => boolean,
): void {
  let current: Card | null = null;
  let keep = true;
  const flush = (): void => {
    const c = current;
    current = null;
    if (c && c.tokens.length > 0) visit.card(c);
  };
  for (let li = 1; li < lines.length; li++) {
    const text = lines[li];
    const at = firstNonBlank(text);
    if (at < 0) continue;
    const c0 = text[at];
    if (c0 === '*') continue;
    if (c0 === '+') {
      if (!keep) continue;
      if (!current) {
        problems.push({ message: 'continuation line (+) with no card before it', line: li + 1, col: at + 1 });
        continue;
      }
      const cur: Card = current;
      tokenizeLine(stripInlineComment(text), li + 1, at + 1, cur.tokens, problems);
      cur.raw += '\n' + text;
      continue;
    }
    flush();
    keep = only ? only(c0) : true;
    if (!keep) continue;
    if (c0 === '.' && /^\.control\b/i.test(text.slice(at))) {
      li = captureControl(lines, li, visit);
      continue;
    }
    const card: Card = { tokens: [], line: li + 1, col: at + 1, raw: text };
    tokenizeLine(stripInlineComment(text), li + 1, at, card.tokens, problems);
    current = card;
  }
  flush();
}

/** Collects raw lines from the `.control` line through `.endc`; returns the index of the last line consumed. */
function captureControl(lines: string[], from: number, visit: CardVisitor): number {
  let li = from + 1;
  let terminated = false;
  for (; li < lines.length; li++) {
    if (/^\s*\.endc\b/i.test(lines[li])) {
      terminated = true;
      break;
    }
  }
  const last = Math.min(li, lines.length - 1);
  visit.controlBlock(lines.slice(from, last + 1).join('\n'), from + 1, terminated);
  return last;
}
