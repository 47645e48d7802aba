// The minimiser child's side of the framed protocol over its stdin and stdout (frames.ts is the
// pool's side): a blocking loop that reads one request, answers its items in order and writes
// the answers back. Plain CommonJS so the child starts under bare node; the fixtures use it too.
'use strict';
const fs = require('fs');

/** Answers already computed are sent at least this often, so the parent's per-function timer can restart. */
const FLUSH_MS = 50;

/** Largest frame either side accepts (a 16-input table is 16 KiB; a long PLA text a few MiB). */
const MAX_FRAME = 256 * 1024 * 1024;

const KIND_TEXT = 0;
const KIND_TABLE = 1;
const STATUS_OK = 0;
const STATUS_ERROR = 1;

const cpuMicros = () => {
  const u = process.cpuUsage();
  return u.user + u.system;
};

let buf = Buffer.allocUnsafe(64 * 1024);
let have = 0;
/** Sleep for the rare stdin left non-blocking (reads then answer EAGAIN instead of waiting). */
const nap = new Int32Array(new SharedArrayBuffer(4));

/**
 * Reads more bytes from stdin, waiting in the kernel (the child has nothing else to do, so no
 * event loop turns between requests). End of input means the pool is gone: exit.
 */
function readMore() {
  if (have === buf.length) {
    const bigger = Buffer.allocUnsafe(buf.length * 2);
    buf.copy(bigger, 0, 0, have);
    buf = bigger;
  }
  let wait = 1;
  for (;;) {
    let got;
    try {
      got = fs.readSync(0, buf, have, buf.length - have, null);
    } catch (err) {
      if (err && err.code === 'EAGAIN') {
        Atomics.wait(nap, 0, 0, wait);
        wait = Math.min(50, wait * 2);
        continue;
      }
      if (err && err.code === 'EOF') process.exit(0);
      throw err;
    }
    if (got === 0) process.exit(0);
    have += got;
    return;
  }
}

function writeAll(out) {
  let at = 0;
  while (at < out.length) {
    try {
      at += fs.writeSync(1, out, at, out.length - at);
    } catch (err) {
      if (err && err.code === 'EAGAIN') {
        Atomics.wait(nap, 0, 0, 1);
        continue;
      }
      // The pool closed our stdout: it is gone or has given up on us.
      process.exit(0);
    }
  }
}

/** Reads one request frame: its id and items (PLA texts, or table payloads { n, on, dc } as bytes). */
function readRequest() {
  while (have < 4) readMore();
  const len = buf.readUInt32LE(0);
  if (len < 8 || len > MAX_FRAME) throw new Error(`a request frame of ${len} bytes`);
  while (have < 4 + len) readMore();
  const end = 4 + len;
  let at = 4;
  const need = (k) => {
    if (at + k > end) throw new Error('a request frame ends inside an item');
  };
  const id = buf.readUInt32LE(at);
  const count = buf.readUInt32LE(at + 4);
  at += 8;
  const items = new Array(count);
  for (let k = 0; k < count; k++) {
    need(1);
    const kind = buf[at++];
    if (kind === KIND_TEXT) {
      need(4);
      const size = buf.readUInt32LE(at);
      at += 4;
      need(size);
      items[k] = buf.toString('utf8', at, at + size);
      at += size;
    } else if (kind === KIND_TABLE) {
      need(5);
      const n = buf[at++];
      const onSize = buf.readUInt32LE(at);
      at += 4;
      need(onSize + 4);
      const on = Buffer.from(buf.subarray(at, at + onSize));
      at += onSize;
      const dcSize = buf.readUInt32LE(at);
      at += 4;
      need(dcSize);
      const dc = Buffer.from(buf.subarray(at, at + dcSize));
      at += dcSize;
      items[k] = { n, on, dc };
    } else throw new Error(`an item of unknown kind ${kind}`);
  }
  if (at !== end) throw new Error('a request frame with bytes after its items');
  // Keep what follows (the pool sends one request at a time, so normally nothing).
  buf.copy(buf, 0, end, have);
  have -= end;
  return { id, items };
}

/** Writes answers from..from+answers.length-1 of request `id`, or the error of item `at`. */
function reply(id, from, answers, error, at) {
  const texts = answers.map((a) => Buffer.from(a, 'latin1'));
  const message = error === undefined ? undefined : Buffer.from(error, 'utf8');
  let size = 4 + 1 + 8 + 4 + 4;
  for (const t of texts) size += 4 + t.length;
  if (message) size += 8 + message.length;
  const out = Buffer.allocUnsafe(4 + size);
  let p = out.writeUInt32LE(size, 0);
  p = out.writeUInt32LE(id, p);
  out[p++] = message ? STATUS_ERROR : STATUS_OK;
  p = out.writeDoubleLE(cpuMicros(), p);
  p = out.writeUInt32LE(from, p);
  p = out.writeUInt32LE(texts.length, p);
  for (const t of texts) {
    p = out.writeUInt32LE(t.length, p);
    p += t.copy(out, p);
  }
  if (message) {
    p = out.writeUInt32LE(at, p);
    p = out.writeUInt32LE(message.length, p);
    message.copy(out, p);
  }
  writeAll(out);
}

/**
 * Serves requests until stdin ends: `answer(item)` gives one item's cube lines as one text (lines
 * joined by "\n") or throws, which reports that item as rejected. Answers go back in order, in as
 * few frames as the flush interval allows.
 */
function serve(answer) {
  for (;;) {
    let req;
    try {
      req = readRequest();
    } catch (err) {
      // A frame we cannot read leaves the stream out of step: say so and stop.
      reply(0, 0, [], String((err && err.message) || err), 0);
      process.exit(2);
    }
    let from = 0;
    let done = [];
    let last = Date.now();
    for (let k = 0; k < req.items.length; k++) {
      try {
        done.push(answer(req.items[k]));
      } catch (err) {
        reply(req.id, from, done, String((err && err.message) || err), k);
        done = undefined;
        break;
      }
      const now = Date.now();
      if (k === req.items.length - 1 || now - last >= FLUSH_MS) {
        reply(req.id, from, done);
        from = k + 1;
        done = [];
        last = now;
      }
    }
  }
}

module.exports = { serve, FLUSH_MS, MAX_FRAME, KIND_TEXT, KIND_TABLE, STATUS_OK, STATUS_ERROR };
