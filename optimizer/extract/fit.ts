// Exact-size copies of short lists for the logic view, made so the engine can keep them cheaply:
// a view of a million-device design holds millions of one- to eight-entry lists.

/**
 * An exact-size copy of a list built by push: V8 grows a pushed-to array to 17 slots, so the
 * short lists a large design keeps by the hundred thousand would be mostly spare. The short ones
 * are written as literals: every list made here is kept in the logic view, and a literal's
 * allocation site lets the engine see that and allocate them straight into long-lived memory,
 * where a copy by slice() is made young and copied twice more by the collector (measured on the
 * bench's 100k design: half the bytes the extraction's young collections copied).
 */
export function fit<T>(a: readonly T[]): T[] {
  switch (a.length) {
    case 0:
      return [];
    case 1:
      return [a[0]];
    case 2:
      return [a[0], a[1]];
    case 3:
      return [a[0], a[1], a[2]];
    case 4:
      return [a[0], a[1], a[2], a[3]];
    case 5:
      return [a[0], a[1], a[2], a[3], a[4]];
    case 6:
      return [a[0], a[1], a[2], a[3], a[4], a[5]];
    case 7:
      return [a[0], a[1], a[2], a[3], a[4], a[5], a[6]];
    case 8:
      return [a[0], a[1], a[2], a[3], a[4], a[5], a[6], a[7]];
    default:
      return a.slice();
  }
}
