// Deck names and values: case-insensitive net names with GND as ground, and numbers that may be
// written as plain numbers, `{name}` or a bare .param name.
import { GROUND } from '../../netlist/ir';
import { parseSpiceNumber } from './numbers';

/**
 * Upper case, without the library call when there is nothing to change (names in large decks are
 * mostly written in capitals already, and the call costs more than the scan).
 */
export function upper(text: string): string {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if ((c >= 97 && c <= 122) || c > 127) return text.toUpperCase();
  }
  return text;
}

/** Net names are case-insensitive; ground is "0" and GND is its alias. */
export function netName(text: string): string {
  const u = upper(text);
  return u === 'GND' ? GROUND : u;
}

/** A number, `{name}` or a bare parameter name; undefined when it is none of those. */
export function numericValue(text: string, params: Record<string, number>): number | undefined {
  let s = text;
  if ((s.startsWith('{') && s.endsWith('}')) || (s.length > 1 && s.startsWith("'") && s.endsWith("'"))) s = s.slice(1, -1).trim();
  // .param names start with a letter or _ (read.ts checks), so a number never names one
  const c0 = s.charCodeAt(0);
  const numberLike = (c0 >= 48 && c0 <= 57) || c0 === 46 || c0 === 43 || c0 === 45;
  if (!numberLike) {
    const p = params[upper(s)];
    if (p !== undefined) return p;
  }
  return parseSpiceNumber(s);
}

/** Model and instance parameters: numbers where they read as numbers, else the text as written. */
export function valueOrText(text: string, params: Record<string, number>): number | string {
  const v = numericValue(text, params);
  return v === undefined ? text : v;
}
