// Wording for where a finding's copies sit: instance paths of bit slices ("bit 3 of slice XSLICE3"),
// the top level, shortened after a few names so messages stay one line.
import type { LogicNode } from '../../extract/types';

const SHOWN = 4;

/** "bit 3 of slice XSLICE3" for a path ending in a number, the path itself otherwise, "top level" for none. */
export function placeOf(path: readonly string[]): string {
  if (path.length === 0) return 'top level';
  const joined = path.join('.');
  const bit = /(\d+)$/.exec(path[path.length - 1]);
  return bit ? `bit ${Number(bit[1])} of slice ${joined}` : `instance ${joined}`;
}

export function describePlaces(nodes: readonly LogicNode[]): string {
  const places = [...new Set(nodes.map((n) => placeOf(n.groups[0]?.path ?? [])))];
  if (places.length <= SHOWN) return places.join(', ');
  return `${places.slice(0, SHOWN).join(', ')}, … (${places.length} places)`;
}
