// The pool's side of the framed protocol with a minimiser child (child-frames.cjs is the child's):
// a request is the job's items in one binary frame on the child's stdin, each reply a frame on its
// stdout with the answers of a run of items (or the error of one) and the child's processor time.
// Little-endian throughout; every frame starts with its body's length.
import type { TablePayload } from './pla';

/** What the child minimises: PLA text (lines joined by "\n") or a checked table it writes the rows of. */
export type PlaItem = string | TablePayload;

const KIND_TEXT = 0;
const KIND_TABLE = 1;
const STATUS_OK = 0;
const STATUS_ERROR = 1;

/** Largest frame either side accepts (child-frames.cjs has the same limit). */
export const MAX_FRAME = 256 * 1024 * 1024;

const LITTLE_ENDIAN = new Uint8Array(Uint32Array.of(1).buffer)[0] === 1;

/** Table words as little-endian bytes (base64 text is decoded). */
function bytesOf(words: Uint32Array | string): Uint8Array {
  if (typeof words === 'string') return Buffer.from(words, 'base64');
  if (LITTLE_ENDIAN) return new Uint8Array(words.buffer, words.byteOffset, words.byteLength);
  const buf = Buffer.allocUnsafe(words.length * 4);
  for (let w = 0; w < words.length; w++) buf.writeUInt32LE(words[w], w * 4);
  return buf;
}

/** One request frame: job id, item count, then each item (text, or input count and table words). */
export function encodeRequest(id: number, items: readonly PlaItem[]): Buffer {
  let size = 8;
  const parts: (Uint8Array | string)[] = [];
  for (const item of items) {
    if (typeof item === 'string') {
      size += 5 + Buffer.byteLength(item, 'utf8');
      parts.push(item);
    } else {
      const on = bytesOf(item.on);
      const dc = bytesOf(item.dc);
      size += 10 + on.length + dc.length;
      parts.push(on, dc);
    }
  }
  const out = Buffer.allocUnsafe(4 + size);
  let at = out.writeUInt32LE(size, 0);
  at = out.writeUInt32LE(id, at);
  at = out.writeUInt32LE(items.length, at);
  let p = 0;
  for (const item of items) {
    if (typeof item === 'string') {
      out[at++] = KIND_TEXT;
      const len = out.write(item, at + 4, 'utf8');
      out.writeUInt32LE(len, at);
      at += 4 + len;
      p++;
    } else {
      out[at++] = KIND_TABLE;
      // An input count the byte cannot hold is sent as 0, which the child refuses.
      out[at++] = Number.isInteger(item.n) && item.n >= 0 && item.n < 256 ? item.n : 0;
      for (const words of [parts[p++], parts[p++]] as Uint8Array[]) {
        at = out.writeUInt32LE(words.length, at);
        out.set(words, at);
        at += words.length;
      }
    }
  }
  return out;
}

/** One reply: answers of items from..from+cubes.length-1 (cube lines as one text each), and on error the item at fault. */
export interface Reply {
  id: number;
  ok: boolean;
  from: number;
  cubes: string[];
  at?: number;
  error?: string;
  /** The child's processor time so far (µs). */
  cpu: number;
}

/** A reply frame that cannot be read: the stream is out of step and the child must be replaced. */
export class FrameError extends Error {}

/** Collects the child's stdout and hands on each whole reply frame, in order. */
export class ReplyReader {
  private buf: Buffer = Buffer.alloc(0);

  constructor(private readonly onReply: (reply: Reply) => void) {}

  push(chunk: Buffer): void {
    this.buf = this.buf.length === 0 ? chunk : Buffer.concat([this.buf, chunk]);
    while (this.buf.length >= 4) {
      const size = this.buf.readUInt32LE(0);
      if (size < 21 || size > MAX_FRAME) throw new FrameError(`a reply frame of ${size} bytes`);
      if (this.buf.length < 4 + size) return;
      const frame = this.buf.subarray(4, 4 + size);
      this.buf = this.buf.subarray(4 + size);
      this.onReply(decodeReply(frame));
    }
  }
}

function decodeReply(f: Buffer): Reply {
  let at = 0;
  const need = (k: number) => {
    if (at + k > f.length) throw new FrameError('a reply frame ends inside an answer');
  };
  const id = f.readUInt32LE(0);
  const status = f[4];
  const cpu = f.readDoubleLE(5);
  const from = f.readUInt32LE(13);
  const count = f.readUInt32LE(17);
  at = 21;
  if (status !== STATUS_OK && status !== STATUS_ERROR) throw new FrameError(`a reply of unknown status ${status}`);
  if (count > f.length) throw new FrameError(`a reply of ${count} answers in ${f.length} bytes`);
  const cubes = new Array<string>(count);
  for (let k = 0; k < count; k++) {
    need(4);
    const len = f.readUInt32LE(at);
    at += 4;
    need(len);
    cubes[k] = f.toString('latin1', at, at + len);
    at += len;
  }
  const reply: Reply = { id, ok: status === STATUS_OK, from, cubes, cpu };
  if (status === STATUS_ERROR) {
    need(8);
    reply.at = f.readUInt32LE(at);
    const len = f.readUInt32LE(at + 4);
    at += 8;
    need(len);
    reply.error = f.toString('utf8', at, at + len);
    at += len;
  }
  if (at !== f.length) throw new FrameError('a reply frame with bytes after its answers');
  return reply;
}
