// The local net numbering a reader made while building a cell, kept beside the cell so flatten can
// take it instead of hashing every terminal's name a second time (a flat million-device deck has
// seven million terminals). It is only ever a hint: flatten checks it against the cell as it is
// now and numbers the cell itself when the two disagree, so a design edited after reading, or one
// from a reader that gives no numbering, flattens exactly as before.
import type { Cell } from './ir';

/** A cell's nets as its reader numbered them, and the number of every terminal and connection. */
export interface CellNumbering {
  /** Net names by number, the cell's ports first; terminals name nets with these very strings. */
  readonly names: readonly string[];
  /**
   * The net of every device terminal, device after device in the cell's order. Which terminal
   * belongs to which device is the cell's to say (its terminal lists): the numbering of a cell
   * depends only on the sequence of names, so the sequence is all that is kept.
   */
  readonly devTerms: IdSequence;
  /** The same for instance connections. */
  readonly instConns: IdSequence;
}

const given = new WeakMap<Cell, CellNumbering>();

/** The numbering a reader left for this cell, if any (check it before use: the cell may have changed). */
export function readerNumbering(cell: Cell): CellNumbering | undefined {
  return given.get(cell);
}

const FIRST_CHUNK = 1024;
const LARGEST_CHUNK = 1 << 20;

/**
 * Numbers appended one by one into chunks that double up to 4 MB and are never copied: typed
 * arrays are memory outside the engine's heap, and every 64 MB more of it since the last full
 * collection starts another (typed-arena.ts), so a list grown by copying would pay for its size
 * several times over while a large deck is being read.
 */
export class IdSequence {
  /** Full chunks, then the one being filled (its first `length - earlier chunks' sizes` entries). */
  readonly chunks: Int32Array[] = [];
  length = 0;
  private last: Int32Array | undefined;
  private at = 0;

  push(id: number): void {
    let last = this.last;
    if (last === undefined || this.at === last.length) {
      last = new Int32Array(last === undefined ? FIRST_CHUNK : Math.min(last.length * 2, LARGEST_CHUNK));
      this.chunks.push(last);
      this.last = last;
      this.at = 0;
    }
    last[this.at++] = id;
    this.length++;
  }
}

/**
 * Records, element by element, the net numbers a reader gives one cell's terminals, in the order
 * the elements join the cell's device and instance lists; `keep` hands the result to flatten.
 */
export class NumberingRecorder {
  private readonly devs = new IdSequence();
  private readonly insts = new IdSequence();

  /** The numbers of the terminals of the device just appended to the cell's devices. */
  device(ids: readonly number[]): void {
    for (let i = 0; i < ids.length; i++) this.devs.push(ids[i]);
  }

  /** The numbers of the connections of the instance just appended to the cell's instances. */
  instance(ids: readonly number[]): void {
    for (let i = 0; i < ids.length; i++) this.insts.push(ids[i]);
  }

  /** Leaves the numbering beside the cell; `names` is the reader's list of net names by number. */
  keep(cell: Cell, names: readonly string[]): void {
    given.set(cell, { names, devTerms: this.devs, instConns: this.insts });
  }
}
