// SPICE-style numbers: engineering suffixes (f p n u m k meg g t, and mil) with trailing letters
// ignored the way the trade's simulators do (`10kOhm` = 10e3, `1uF` = 1e-6, `1F` = 1e-15).

const NUMBER = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)([a-zA-Z]*)$/;

const SUFFIX: Record<string, number> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  m: 1e-3,
  k: 1e3,
  g: 1e9,
  t: 1e12,
};

/** The value of a SPICE number, or undefined when the text is not one. */
export function parseSpiceNumber(text: string): number | undefined {
  if (text.length > 0 && text.length < 16 && allDigits(text)) return Number(text);
  const m = NUMBER.exec(text);
  if (!m) return undefined;
  const base = Number(m[1]);
  const letters = m[2].toLowerCase();
  if (!Number.isFinite(base)) return undefined;
  let scale = 1;
  if (letters.startsWith('meg')) scale = 1e6;
  else if (letters.startsWith('mil')) scale = 25.4e-6;
  else if (letters.length > 0 && SUFFIX[letters[0]] !== undefined) scale = SUFFIX[letters[0]];
  const v = base * scale;
  return Number.isFinite(v) ? v : undefined;
}

/** Plain unsigned integers (most values in a deck) need no pattern match: 15 digits are exact. */
function allDigits(text: string): boolean {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 48 || c > 57) return false;
  }
  return true;
}

/** Shortest text that reads back to exactly the same number. */
export function formatSpiceNumber(v: number): string {
  return String(v);
}
