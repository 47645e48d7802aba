// Turns deck text into logical cards: comments removed, `+` continuations joined, tokens located
// (line and column from 1). Separators are blanks and commas; `(` `)` `=` are tokens of their own;
// `{…}` and `'…'` stay whole so parameter references keep their braces.
import { empty } from '../../netlist/empty';

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
  readonly raw: string;
}

/**
 * The one card forEachCard fills and hands out, again and again: a large deck has millions of
 * cards, and none outlives its visit, so neither the card, its token list nor the tokens are
 * allocated per card. `raw` is built only when asked for (few cards are kept verbatim).
 */
class ReusedCard implements Card {
  tokens: Token[] = [];
  line = 0;
  col = 0;
  /** Start and end offsets in `text` of each physical line of the card. */
  spans: number[] = [];
  constructor(private readonly text: string) {}

  get raw(): string {
    let s = this.text.slice(this.spans[0], this.spans[1]);
    for (let i = 2; i < this.spans.length; i += 2) s += '\n' + this.text.slice(this.spans[i], this.spans[i + 1]);
    return s;
  }
}

/** Token objects reused card after card: entry k is the card's k-th token. */
class TokenPool {
  private readonly pool: Token[] = [];

  emit(out: Token[], text: string, line: number, col: number): void {
    const k = out.length;
    let t = this.pool[k];
    if (t === undefined) {
      t = { text, line, col };
      this.pool.push(t);
    } else {
      t.text = text;
      t.line = line;
      t.col = col;
    }
    out.push(t);
  }
}

const FRESH: Pick<TokenPool, 'emit'> = {
  emit(out, text, line, col) {
    out.push({ text, line, col });
  },
};

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
const SEMICOLON = 59;

function isSeparator(c: number): boolean {
  return c === SPACE || c === TAB || c === COMMA || c === CR || c === FF || c === VT;
}

/** Tokenizes one physical line (after comment removal) starting at column offset `from`. */
export function tokenizeLine(text: string, lineNo: number, from: number, out: Token[], problems: TokenizeProblem[]): void {
  tokenizeRange(text, 0, from, text.length, lineNo, out, problems, FRESH);
}

/**
 * Tokenizes text[lineStart + from, end) of a line that starts at lineStart in a larger text, so a
 * deck is read in place: only the tokens become strings, never the lines they sit on.
 */
function tokenizeRange(
  text: string,
  lineStart: number,
  from: number,
  end: number,
  lineNo: number,
  out: Token[],
  problems: TokenizeProblem[],
  tokens: Pick<TokenPool, 'emit'>,
): void {
  let i = lineStart + from;
  while (i < end) {
    const c = text.charCodeAt(i);
    if (isSeparator(c)) {
      i++;
      continue;
    }
    if (c === 40 || c === 41 || c === 61) {
      // ( ) =
      tokens.emit(out, text[i], lineNo, i - lineStart + 1);
      i++;
      continue;
    }
    if (c === 123 || c === 39) {
      // { … } or ' … '
      const close = c === 123 ? 125 : 39;
      let stop = i + 1;
      while (stop < end && text.charCodeAt(stop) !== close) stop++;
      if (stop >= end) {
        problems.push({ message: `unterminated ${c === 123 ? '{' : "'"} expression`, line: lineNo, col: i - lineStart + 1 });
        return;
      }
      tokens.emit(out, text.slice(i, stop + 1), lineNo, i - lineStart + 1);
      i = stop + 1;
      continue;
    }
    const start = i;
    while (i < end) {
      const d = text.charCodeAt(i);
      if (isSeparator(d) || d === 40 || d === 41 || d === 61 || d === 123) break;
      i++;
    }
    tokens.emit(out, text.slice(start, i), lineNo, start - lineStart + 1);
  }
}

/** Offset of the first non-blank character of text[from, end), or -1 for a blank line. */
function firstNonBlank(text: string, from: number, end: number): number {
  for (let i = from; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c !== SPACE && c !== TAB && c !== CR && c !== FF && c !== VT) return i;
  }
  return -1;
}

/** End of a line's content before an inline `;` comment. */
function commentStart(text: string, from: number, end: number): number {
  // scanned by hand: indexOf would search the rest of the deck when the line has no comment
  for (let i = from; i < end; i++) if (text.charCodeAt(i) === SEMICOLON) return i;
  return end;
}

export interface CardVisitor {
  /** The card and its tokens are reused for the next card once this returns: copy what is kept. */
  card(card: Card): void;
  /** Raw lines of a `.control` block from the `.control` line through `.endc` (kept verbatim). */
  controlBlock(raw: string, line: number, terminated: boolean): void;
}

const PLUS = 43;
const STAR = 42;
const DOT = 46;

/**
 * Walks the deck's cards (line 1, the title, is skipped), reading the text in place line by line
 * (no array of lines: a large flat deck has millions). `only` filters by the first character of
 * a card so a cheap first pass can look at dot cards alone without tokenizing every element.
 */
export function forEachCard(
  text: string,
  visit: CardVisitor,
  problems: TokenizeProblem[],
  only?: (firstChar: string) => boolean,
): void {
  const card = new ReusedCard(text);
  const pool = new TokenPool();
  let open = false;
  let keep = true;
  const flush = (): void => {
    if (open && card.tokens.length > 0) visit.card(card);
    open = false;
  };
  const n = text.length;
  let lineNo = 1;
  let pos = text.indexOf('\n');
  if (pos < 0) return;
  pos++;
  // The lines split('\n') would give: the last one may be empty (text ending in a newline).
  while (pos <= n) {
    lineNo++;
    let end = text.indexOf('\n', pos);
    if (end < 0) end = n;
    const lineStart = pos;
    pos = end + 1;
    const at = firstNonBlank(text, lineStart, end);
    if (at < 0) continue;
    const c0 = text.charCodeAt(at);
    if (c0 === STAR) continue;
    if (c0 === PLUS) {
      if (!keep) continue;
      if (!open) {
        problems.push({ message: 'continuation line (+) with no card before it', line: lineNo, col: at - lineStart + 1 });
        continue;
      }
      tokenizeRange(text, lineStart, at - lineStart + 1, commentStart(text, lineStart, end), lineNo, card.tokens, problems, pool);
      card.spans.push(lineStart, end);
      continue;
    }
    flush();
    keep = only ? only(text[at]) : true;
    if (!keep) continue;
    if (c0 === DOT && /^\.control\b/i.test(text.slice(at, end))) {
      const after = captureControl(text, lineStart, pos, lineNo, visit);
      pos = after.pos;
      lineNo += after.lines;
      continue;
    }
    empty(card.tokens);
    empty(card.spans);
    card.spans.push(lineStart, end);
    card.line = lineNo;
    card.col = at - lineStart + 1;
    tokenizeRange(text, lineStart, at - lineStart, commentStart(text, lineStart, end), lineNo, card.tokens, problems, pool);
    open = true;
  }
  flush();
}

/**
 * Collects raw lines from the `.control` line (at `start`) through `.endc`; returns the offset just
 * past the last line consumed and how many lines after the `.control` line it consumed.
 */
function captureControl(text: string, start: number, next: number, lineNo: number, visit: CardVisitor): { pos: number; lines: number } {
  const n = text.length;
  let pos = next;
  let lines = 0;
  let terminated = false;
  let last = Math.min(next - 1, n); // end of the .control line itself
  while (pos <= n) {
    let end = text.indexOf('\n', pos);
    if (end < 0) end = n;
    last = end;
    lines++;
    const isEnd = /^\s*\.endc\b/i.test(text.slice(pos, end));
    pos = end + 1;
    if (isEnd) {
      terminated = true;
      break;
    }
  }
  visit.controlBlock(text.slice(start, last), lineNo, terminated);
  return { pos, lines };
}
