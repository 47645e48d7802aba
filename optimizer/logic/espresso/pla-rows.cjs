// Berkeley PLA lines of one output, built inside the minimiser child from the output's truth-table
// words (a few bytes each way instead of one text row per minterm). Plain CommonJS: the child runs
// under bare node. The lines are the ones pla.ts's buildPla gives for the same table, row for row.
'use strict';

const MAX_INPUTS = 16;

/**
 * Row text of minterm m (n binary digits, input 0 first, then the output mark), per input count
 * and mark, built on first use and kept: later PLAs of that size allocate no row strings.
 */
const rowCache = new Map();
function rowsFor(n, mark) {
  const key = `${n}${mark}`;
  let rows = rowCache.get(key);
  if (!rows) {
    const size = 2 ** n;
    rows = new Array(size);
    for (let m = 0; m < size; m++) rows[m] = m.toString(2).padStart(n, '0') + mark;
    rowCache.set(key, rows);
  }
  return rows;
}

/** Little-endian 32-bit words from base64 text, exactly `count` of them, or an error. */
function decodeWords(text, count, what) {
  if (typeof text !== 'string') throw new Error(`the ${what} words are missing`);
  const buf = Buffer.from(text, 'base64');
  if (buf.length !== count * 4) throw new Error(`the ${what} words are ${buf.length} bytes, expected ${count * 4}`);
  const words = new Array(count);
  for (let w = 0; w < count; w++) words[w] = buf.readUInt32LE(w * 4);
  return words;
}

/** Appends a row per set bit (ascending minterms) with `mark` as the output column. */
function pushRows(lines, words, n, mark) {
  const size = 2 ** n;
  const text = rowsFor(n, mark);
  let rows = 0;
  for (let w = 0; w < words.length; w++) {
    let word = words[w];
    while (word !== 0) {
      const low = word & -word;
      const m = w * 32 + (31 - Math.clz32(low));
      word ^= low;
      if (m >= size) throw new Error(`minterm ${m} is outside 0..${size - 1}`);
      lines.push(text[m]);
      rows++;
    }
  }
  return rows;
}

/**
 * Type-fd PLA lines of a table payload { n, on, dc } (words as base64, little-endian). Throws on
 * anything but a well-formed table with at least one on-set minterm and no minterm both on and
 * don't-care, so the native code only ever sees rows this function wrote.
 */
function tableLines(p) {
  if (!p || typeof p !== 'object') throw new Error('a table payload must be an object');
  const n = p.n;
  if (!Number.isInteger(n) || n < 1 || n > MAX_INPUTS) throw new Error(`.i ${n} is outside 1..${MAX_INPUTS}`);
  const count = Math.max(1, Math.ceil(2 ** n / 32));
  const on = decodeWords(p.on, count, 'on-set');
  const dc = decodeWords(p.dc, count, "don't-care");
  for (let w = 0; w < count; w++) if ((on[w] & dc[w]) !== 0) throw new Error('a minterm is both on and don\'t-care');
  const lines = [`.i ${n}`, '.o 1', '.type fd'];
  // A PLA with no on-set rows corrupts the next call inside the native code.
  if (pushRows(lines, on, n, ' 1') === 0) throw new Error('a PLA with no on-set rows is never run (the function is constant)');
  pushRows(lines, dc, n, ' -');
  lines.push('.e');
  return lines;
}

module.exports = { tableLines, MAX_INPUTS };
