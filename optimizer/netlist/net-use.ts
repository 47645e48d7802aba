// How many terminals touch each net of one cell, nets numbered in first-seen order (ports first).
// Validation's single-terminal check reads it; a reader that already walks every terminal can fill
// it as it goes, so a large cell is not walked and hashed a second time.
import { NameTable } from './name-table';

export class NetUse {
  /** Net name → its number, numbered in first-seen order. */
  readonly table = new NameTable();
  /** Terminals (and port entries) touching each net, by number. */
  counts = new Int32Array(64);

  /** Starts with the cell's ports, each counted once as the port list itself touches it. */
  constructor(ports: readonly string[] = []) {
    for (const p of ports) this.counts[this.add(p)]++;
  }

  /** Net names by number (the first string met for each name, shared by later uses). */
  get names(): readonly string[] {
    return this.table.names;
  }

  /** The net's number, registering it (with no count yet) on first sight. */
  add(name: string): number {
    const i = this.table.add(name);
    if (i === this.counts.length) {
      const grown = new Int32Array(this.counts.length * 2);
      grown.set(this.counts);
      this.counts = grown;
    }
    return i;
  }

  /** Counts one more terminal on the net. */
  touch(name: string): void {
    // Numbered first: add() may replace `counts`, so the array is read after it.
    const i = this.add(name);
    this.counts[i]++;
  }
}
