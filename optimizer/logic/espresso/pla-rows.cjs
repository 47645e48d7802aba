// Berkeley PLA of one output, written inside the minimiser child from the output's truth-table
// words (a few bytes each way instead of one text row per minterm). Plain CommonJS: the child runs
// under bare node. The text is pla.ts's buildPlaText for the same table, byte for byte.
'use strict';

const MAX_INPUTS = 16;
const C0 = 48;
const C1 = 49;
const NL = 10;
const LITTLE_ENDIAN = new Uint8Array(Uint32Array.of(1).buffer)[0] === 1;

/**
 * The input digits of every minterm of an n-input table (n bytes per minterm, input 0 first),
 * built on first use and kept: later PLAs of that size copy bytes and allocate no row strings.
 */
const digitCache = new Map();
function digitsFor(n) {
  let digits = digitCache.get(n);
  if (!digits) {
    const size = 2 ** n;
    digits = new Uint8Array(size * n);
    for (let m = 0, at = 0; m < size; m++) for (let i = 0; i < n; i++) digits[at++] = (m >>> (n - 1 - i)) & 1 ? C1 : C0;
    digitCache.set(n, digits);
  }
  return digits;
}

/**
 * Little-endian 32-bit words, exactly `count` of them, or an error: from the bytes the pool frames
 * (a Buffer or Uint8Array), from base64 text, or as words already (a Uint32Array).
 */
function decodeWords(data, count, what) {
  if (data instanceof Uint32Array) {
    if (data.length !== count) throw new Error(`the ${what} words are ${data.length * 4} bytes, expected ${count * 4}`);
    return data;
  }
  let buf;
  if (typeof data === 'string') buf = Buffer.from(data, 'base64');
  else if (data instanceof Uint8Array) buf = data;
  else throw new Error(`the ${what} words are missing`);
  if (buf.length !== count * 4) throw new Error(`the ${what} words are ${buf.length} bytes, expected ${count * 4}`);
  const words = new Uint32Array(count);
  if (LITTLE_ENDIAN) new Uint8Array(words.buffer).set(buf);
  else for (let w = 0; w < count; w++) words[w] = (buf[4 * w] | (buf[4 * w + 1] << 8) | (buf[4 * w + 2] << 16) | (buf[4 * w + 3] << 24)) >>> 0;
  return words;
}

/** Calls `visit` with each set bit of the words (a minterm), ascending. */
function eachSetBit(words, visit) {
  for (let w = 0; w < words.length; w++) {
    let word = words[w];
    while (word !== 0) {
      const low = word & -word;
      visit(w * 32 + (31 - Math.clz32(low)));
      word ^= low;
    }
  }
}

/** Set bits of the words (minterms below 2^n) or an error for one past it. */
function countRows(words, n) {
  const size = 2 ** n;
  let rows = 0;
  eachSetBit(words, (m) => {
    if (m >= size) throw new Error(`minterm ${m} is outside 0..${size - 1}`);
    rows++;
  });
  return rows;
}

/** Writes a row per set bit (ascending minterms): the digits, a space, `mark`, a line break. */
function writeRows(buf, at, words, n, mark) {
  const digits = digitsFor(n);
  eachSetBit(words, (m) => {
    for (let i = 0, d = m * n; i < n; i++) buf[at++] = digits[d + i];
    buf[at++] = 32;
    buf[at++] = mark;
    buf[at++] = NL;
  });
  return at;
}

/**
 * Type-fd PLA (lines joined by "\n", ".e" last) of a table payload { n, on, dc } (words as
 * little-endian bytes or base64 text, or a Uint32Array), as Latin-1 bytes. Throws on anything but
 * a well-formed table with at least one on-set minterm and no minterm both on and don't-care, so
 * the native code only sees text written here.
 */
function tableBytes(p) {
  if (!p || typeof p !== 'object') throw new Error('a table payload must be an object');
  const n = p.n;
  if (!Number.isInteger(n) || n < 1 || n > MAX_INPUTS) throw new Error(`.i ${n} is outside 1..${MAX_INPUTS}`);
  const count = Math.max(1, Math.ceil(2 ** n / 32));
  const on = decodeWords(p.on, count, 'on-set');
  const dc = decodeWords(p.dc, count, "don't-care");
  for (let w = 0; w < count; w++) if ((on[w] & dc[w]) !== 0) throw new Error('a minterm is both on and don\'t-care');
  const onRows = countRows(on, n);
  // A PLA with no on-set rows corrupts the next call inside the native code.
  if (onRows === 0) throw new Error('a PLA with no on-set rows is never run (the function is constant)');
  const rows = onRows + countRows(dc, n);
  const head = `.i ${n}\n.o 1\n.type fd\n`;
  const buf = Buffer.allocUnsafe(head.length + rows * (n + 3) + 2);
  let at = buf.latin1Write(head, 0);
  at = writeRows(buf, at, on, n, C1);
  at = writeRows(buf, at, dc, n, 45); // '-'
  buf[at++] = 46; // ".e"
  buf[at++] = 101;
  return buf.subarray(0, at);
}

/**
 * The same PLA as one string. One string, not a line per row: the native bridge copies and
 * writes each array element separately, and the file it reads back is the same either way.
 */
function tableText(p) {
  const bytes = tableBytes(p);
  return bytes.latin1Slice(0, bytes.length);
}

/** The same PLA as lines. */
function tableLines(p) {
  return tableText(p).split('\n');
}

module.exports = { tableBytes, tableText, tableLines, MAX_INPUTS };
