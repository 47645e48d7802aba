// Berkeley PLA exchanged with the Espresso process: as text built from one output of a truth table
// (validated by a single pass over its characters: the native code exits on malformed input), or
// as the output's checked table words from which the child writes the same rows; parsed on return.
import { InternalError } from '../../errors';
import type { Cover, Cube } from '../cubes';
import { forEachMinterm, popcount, words, type OutputTable } from '../truth-table';

/** Largest input count sent to Espresso (2^16 rows of minterms at most). */
export const MAX_ESPRESSO_INPUTS = 16;

const C0 = 48;
const C1 = 49;
const DASH = 45;
const SPACE = 32;
const NL = 10;

/** Appends one row per set bit of `set` (minterm as n binary digits, then " " and `mark`). */
function writeRows(buf: Uint8Array, at: number, set: Uint32Array, n: number, mark: number): number {
  forEachMinterm(set, n, (m) => {
    for (let i = 0; i < n; i++) buf[at++] = (m >>> (n - 1 - i)) & 1 ? C1 : C0;
    buf[at++] = SPACE;
    buf[at++] = mark;
    buf[at++] = NL;
  });
  return at;
}

/** Type-fd PLA text of one non-constant output: on-set rows "…1", don't-care rows "…-", lines joined by "\n". */
export function buildPlaText(out: OutputTable, n: number): string {
  const head = `.i ${n}\n.o 1\n.type fd\n`;
  const rows = popcount(out.on) + popcount(out.dc);
  const buf = new Uint8Array(head.length + rows * (n + 3) + 2);
  for (let i = 0; i < head.length; i++) buf[i] = head.charCodeAt(i);
  let at = writeRows(buf, head.length, out.on, n, C1);
  at = writeRows(buf, at, out.dc, n, DASH);
  buf[at++] = 46; // ".e"
  buf[at++] = 101;
  return Buffer.from(buf.buffer, buf.byteOffset, at).toString('latin1');
}

/** The same PLA as lines (the form the native call takes). */
export function buildPla(out: OutputTable, n: number): string[] {
  return buildPlaText(out, n).split('\n');
}

/** Why PLA text (lines joined by "\n") must not be sent, or undefined when it is safe. */
export function plaTextProblem(text: string): string | undefined {
  return plaBytesProblem(Buffer.from(text, 'latin1'), text);
}

/**
 * The check itself, one pass over the bytes (no regular expression or string per row): a header
 * of ".i N", ".o M" and an optional ".type", rows of N of 0/1/- then a space and M of 0/1/-/~,
 * ".e" last, and at least one on-set row.
 */
function plaBytesProblem(buf: Uint8Array, text: string): string | undefined {
  const head = /^\.i (\d+)\n\.o (\d+)\n(\.type (?:f|fd|fr|fdr)\n)?/.exec(text.slice(0, 40));
  if (!head) {
    const first = text.slice(0, 200).split('\n', 3);
    if (!/^\.i (\d+)$/.test(first[0] ?? '') || !/^\.o (\d+)$/.test(first[1] ?? '')) return 'a PLA must start with ".i N" and ".o M"';
  }
  const first = text.slice(0, 200).split('\n', 3);
  const n = Number(/^\.i (\d+)$/.exec(first[0])![1]);
  const o = Number(/^\.o (\d+)$/.exec(first[1])![1]);
  if (n < 1 || n > MAX_ESPRESSO_INPUTS) return `.i ${n} is outside 1..${MAX_ESPRESSO_INPUTS}`;
  if (o < 1 || o > 64) return `.o ${o} is outside 1..64`;
  if (!text.endsWith('\n.e')) return 'a PLA must end with ".e"';
  let at = head ? head[0].length : first[0].length + first[1].length + 2;
  let lineNo = head ? (head[3] ? 4 : 3) : 3;
  const end = buf.length - 2; // start of ".e"
  const width = n + 1 + o;
  let rows = 0;
  let onRows = 0;
  while (at < end) {
    let ok = at + width < buf.length && buf[at + width] === NL && buf[at + n] === SPACE;
    for (let i = 0; ok && i < n; i++) {
      const c = buf[at + i];
      ok = c === C0 || c === C1 || c === DASH;
    }
    let on = false;
    for (let i = n + 1; ok && i < width; i++) {
      const c = buf[at + i];
      if (c === C1) on = true;
      else ok = c === C0 || c === DASH || c === 126; // '~'
    }
    if (!ok) {
      const stop = text.indexOf('\n', at);
      return `line ${lineNo} "${text.slice(at, Math.min(stop < 0 ? text.length : stop, at + 40))}" is not a row of ${n} inputs and ${o} outputs`;
    }
    rows++;
    if (on) onRows++;
    at += width + 1;
    lineNo++;
  }
  // A PLA with no product rows corrupts the next call inside the native code.
  if (rows === 0 || onRows === 0) return 'a PLA with no on-set rows is never sent (the function is constant)';
  return undefined;
}

/** Why PLA lines must not be sent, or undefined when they are safe. */
export function plaProblem(lines: string[]): string | undefined {
  if (lines.some((l) => l.includes('\n'))) return 'a PLA line must not contain a line break';
  return plaTextProblem(lines.join('\n'));
}

/**
 * Parses Espresso's single-output cube lines ("1-0 1") into a cover, one pass over the character
 * codes of each line (surrounding blanks allowed, nothing else).
 */
export function parseCubes(lines: string[], n: number): Cover {
  const cover: Cover = new Array(lines.length);
  for (let k = 0; k < lines.length; k++) cover[k] = parseCube(lines[k], 0, lines[k].length, n);
  return cover;
}

/** The same from the cube lines as one text (lines joined by "\n", "" for none), without splitting it. */
export function parseCubesText(text: string, n: number): Cover {
  const cover: Cover = [];
  if (text === '') return cover;
  let start = 0;
  for (;;) {
    const stop = text.indexOf('\n', start);
    const end = stop < 0 ? text.length : stop;
    cover.push(parseCube(text, start, end, n));
    if (stop < 0) return cover;
    start = stop + 1;
  }
}

/** One cube line: the characters of `text` from `at` to `end`. */
function parseCube(text: string, at: number, end: number, n: number): Cube {
  const from = at;
  const to = end;
  while (at < end && isBlank(text.charCodeAt(at))) at++;
  while (end > at && isBlank(text.charCodeAt(end - 1))) end--;
  let ok = end - at === n + 2 && text.charCodeAt(at + n) === SPACE && text.charCodeAt(at + n + 1) === C1;
  let care = 0;
  let value = 0;
  for (let i = 0; ok && i < n; i++) {
    const c = text.charCodeAt(at + i);
    const bit = 1 << (n - 1 - i);
    if (c === C1) {
      care |= bit;
      value |= bit;
    } else if (c === C0) care |= bit;
    else ok = c === DASH;
  }
  if (!ok) throw new InternalError(`unexpected line from the minimiser: "${text.slice(from, Math.min(to, from + 60))}"`);
  return { care, value };
}

const isBlank = (c: number) => c === SPACE || c === 9 || c === NL || c === 13;

/**
 * One output as the child takes it: input count and the on-set and don't-care words (sent as
 * little-endian bytes; base64 text of those bytes is taken too).
 */
export interface TablePayload {
  n: number;
  on: Uint32Array | string;
  dc: Uint32Array | string;
}

/**
 * The table of one non-constant output, checked before it is sent: the child writes the PLA rows
 * from it (pla-rows.cjs gives buildPla's lines), so these checks stand for the text's — input
 * count in range, the right number of words, no minterm past 2^n, none both on and don't-care, and
 * at least one on-set minterm. Returns the payload or why it must not be sent.
 */
export function tablePayload(out: OutputTable, n: number): TablePayload | string {
  if (!Number.isInteger(n) || n < 1 || n > MAX_ESPRESSO_INPUTS) return `.i ${n} is outside 1..${MAX_ESPRESSO_INPUTS}`;
  const count = words(n);
  if (out.on.length !== count || out.dc.length !== count) return `the table of ${out.name} has ${out.on.length} words, expected ${count}`;
  const valid = n >= 5 ? 0xffffffff : 2 ** 2 ** n - 1;
  let any = 0;
  for (let w = 0; w < count; w++) {
    if (((out.on[w] | out.dc[w]) & ~valid) !== 0) return `the table of ${out.name} sets minterms past ${2 ** n - 1}`;
    if ((out.on[w] & out.dc[w]) !== 0) return `a minterm of ${out.name} is both on and don't-care`;
    any |= out.on[w];
  }
  // A PLA with no product rows corrupts the next call inside the native code.
  if (any === 0) return 'a PLA with no on-set rows is never sent (the function is constant)';
  // The table's own words, not copies: the child checks them again before writing any row, so
  // a table changed while its request waits cannot put unchecked text in front of the native code.
  return { n, on: out.on, dc: out.dc };
}
