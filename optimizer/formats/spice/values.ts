// Deck names and values: case-insensitive net names with GND as ground, and numbers that may be
// written as plain numbers, `{name}` or a bare .param name.
import { GROUND } from '../../netlist/ir';
import { parseSpiceNumber } from './numbers';

/** Net names are case-insensitive; ground is "0" and GND is its alias. */
export function netName(text: string): string {
  const u = text.toUpperCase();
  return u === 'GND' ? GROUND : u;
}

/** A number, `{name}` or a bare parameter name; undefined when it is none of those. */
export function numericValue(text: string, params: Record<string, number>): number | undefined {
  let s = text;
  if ((s.startsWith('{') && s.endsWith('}')) || (s.length > 1 && s.startsWith("'") && s.endsWith("'"))) s = s.slice(1, -1).trim();
  const p = params[s.toUpperCase()];
  if (p !== undefined) return p;
  return parseSpiceNumber(s);
}

/** Model and instance parameters: numbers where they read as numbers, else the text as written. */
export function valueOrText(text: string, params: Record<string, number>): number | string {
  const v = numericValue(text, params);
  return v === undefined ? text : v;
}
