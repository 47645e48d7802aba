// Positions inside JSON text: where a value at a path starts (for schema errors) and where the
// first syntax error is (JSON.parse does not say). Explicit stacks, so deep nesting cannot
// overflow the call stack; linear in the text.

export interface TextPos {
  line: number;
  col: number;
}

export function posToLineCol(text: string, pos: number): TextPos {
  let line = 1;
  let last = -1;
  for (let i = text.indexOf('\n'); i >= 0 && i < pos; i = text.indexOf('\n', i + 1)) {
    line++;
    last = i;
  }
  return { line, col: pos - last };
}

function skipWs(t: string, i: number): number {
  while (i < t.length) {
    const c = t.charCodeAt(i);
    if (c !== 32 && c !== 9 && c !== 10 && c !== 13) break;
    i++;
  }
  return i;
}

/** End of the string literal starting at i (index after the closing quote), or -1. */
function skipString(t: string, i: number): number {
  for (let k = i + 1; k < t.length; k++) {
    const c = t.charCodeAt(k);
    if (c === 92) k++;
    else if (c === 34) return k + 1;
    else if (c < 32) return -1;
  }
  return -1;
}

/** End of the value starting at i, for text already known to be valid JSON. */
function skipValue(t: string, i: number): number {
  const c = t[i];
  if (c === '"') return skipString(t, i);
  if (c === '{' || c === '[') {
    let depth = 0;
    for (let k = i; k < t.length; k++) {
      const d = t[k];
      if (d === '"') k = skipString(t, k) - 1;
      else if (d === '{' || d === '[') depth++;
      else if (d === '}' || d === ']') {
        depth--;
        if (depth === 0) return k + 1;
      }
    }
    return t.length;
  }
  let k = i;
  while (k < t.length && !',}] \t\r\n'.includes(t[k])) k++;
  return k;
}

/** Start of the value at `path` in valid JSON text; the deepest existing ancestor when absent. */
export function locatePath(text: string, path: readonly PropertyKey[]): number {
  let pos = skipWs(text, 0);
  for (const seg of path) {
    const open = text[pos];
    if (open === '{') {
      let k = skipWs(text, pos + 1);
      let found = -1;
      while (k < text.length && text[k] === '"') {
        const end = skipString(text, k);
        const key = JSON.parse(text.slice(k, end)) as string;
        k = skipWs(text, skipWs(text, end) + 1);
        if (key === String(seg)) {
          found = k;
          break;
        }
        k = skipWs(text, skipValue(text, k));
        if (text[k] === ',') k = skipWs(text, k + 1);
      }
      if (found < 0) return pos;
      pos = found;
    } else if (open === '[' && typeof seg === 'number') {
      let k = skipWs(text, pos + 1);
      for (let n = 0; n < seg && k < text.length && text[k] !== ']'; n++) {
        k = skipWs(text, skipValue(text, k));
        if (text[k] === ',') k = skipWs(text, k + 1);
      }
      if (text[k] === ']') return pos;
      pos = k;
    } else return pos;
  }
  return pos;
}

/** The first syntax error of JSON text: its position and a plain message; null when valid. */
export function findJsonSyntaxError(t: string): { pos: number; message: string } | null {
  // States: expecting a value, or after a value inside a container.
  const stack: ('{' | '[')[] = [];
  let i = skipWs(t, 0);
  let expectValue = true;
  let expectKey = false;
  let justOpened = false;
  const err = (pos: number, message: string) => ({ pos, message });
  while (true) {
    i = skipWs(t, i);
    if (expectKey) {
      if (t[i] === '}' && justOpened) {
        stack.pop();
        i++;
        expectKey = false;
        expectValue = false;
        continue;
      }
      justOpened = false;
      if (t[i] !== '"') return err(i, i >= t.length ? 'unexpected end of JSON' : `expected a "key", found ${show(t[i])}`);
      const end = skipString(t, i);
      if (end < 0) return err(i, 'unterminated string');
      i = skipWs(t, end);
      if (t[i] !== ':') return err(i, `expected ':', found ${show(t[i])}`);
      i++;
      expectKey = false;
      expectValue = true;
      continue;
    }
    if (expectValue) {
      if (i >= t.length) return err(i, 'unexpected end of JSON');
      const c = t[i];
      if (c === '{') {
        stack.push('{');
        i++;
        expectKey = true;
        justOpened = true;
        expectValue = false;
        continue;
      }
      if (c === '[') {
        stack.push('[');
        i = skipWs(t, i + 1);
        if (t[i] === ']') {
          stack.pop();
          i++;
          expectValue = false;
        }
        continue;
      }
      if (c === '"') {
        const end = skipString(t, i);
        if (end < 0) return err(i, 'unterminated string (or a control character inside it)');
        i = end;
      } else {
        const m = /^(-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?|true|false|null)/.exec(t.slice(i, i + 400));
        if (!m) return err(i, `unexpected ${show(c)}`);
        i += m[0].length;
      }
      expectValue = false;
      continue;
    }
    // After a value.
    if (stack.length === 0) {
      return i >= t.length ? null : err(i, `unexpected ${show(t[i])} after the end of the JSON value`);
    }
    const top = stack[stack.length - 1];
    if (t[i] === ',') {
      i++;
      if (top === '{') expectKey = true;
      else expectValue = true;
      continue;
    }
    if ((top === '{' && t[i] === '}') || (top === '[' && t[i] === ']')) {
      stack.pop();
      i++;
      continue;
    }
    return err(i, i >= t.length ? 'unexpected end of JSON' : `expected ',' or '${top === '{' ? '}' : ']'}', found ${show(t[i])}`);
  }
}

function show(c: string | undefined): string {
  return c === undefined ? 'end of input' : `'${c}'`;
}
