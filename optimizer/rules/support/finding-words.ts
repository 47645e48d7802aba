// Words for where a structure sits in the hierarchy, for finding messages: "bit 3 of slice XSLICE3"
// when the innermost instance name ends in a number, "instance XALU.XEN" otherwise, "the top level";
// lists of places and names shortened after a few so messages stay one line.
import type { LogicNode } from '../../extract/types';

export function placeOf(path: readonly string[]): string {
  if (path.length === 0) return 'the top level';
  const joined = path.join('.');
  const m = /(\d+)$/.exec(path[path.length - 1]);
  return m ? `bit ${Number(m[1])} of slice ${joined}` : `instance ${joined}`;
}

/** Distinct instance paths of some devices' paths, joined, in order of first appearance. */
export function instancesOf(paths: readonly (readonly string[])[]): string[] {
  return [...new Set(paths.filter((p) => p.length > 0).map((p) => p.join('.')))];
}

/** "a, b and c" (at most `max` names, then "and N more"). */
export function listWords(items: readonly string[], max = 4): string {
  if (items.length === 0) return 'nothing';
  const shown = items.slice(0, max);
  const rest = items.length - shown.length;
  if (rest > 0) return `${shown.join(', ')} and ${rest} more`;
  return shown.length === 1 ? shown[0] : `${shown.slice(0, -1).join(', ')} and ${shown[shown.length - 1]}`;
}

const PLACES_SHOWN = 4;

/** Distinct places of some logic nodes (their first group's path), shortened after four. */
export function describePlaces(nodes: readonly LogicNode[]): string {
  const places = [...new Set(nodes.map((n) => placeOf(n.groups[0]?.path ?? [])))];
  if (places.length <= PLACES_SHOWN) return places.join(', ');
  return `${places.slice(0, PLACES_SHOWN).join(', ')}, … (${places.length} places)`;
}
