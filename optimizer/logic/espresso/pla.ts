// Berkeley PLA text exchanged with the Espresso process: built from one output of a truth table,
// validated before it is sent (the native code exits on malformed input) and parsed on return.
import { InternalError } from '../../errors';
import { type Cover, cubeFromString } from '../cubes';
import { mintermsOf, type OutputTable } from '../truth-table';

/** Largest input count sent to Espresso (2^16 rows of minterms at most). */
export const MAX_ESPRESSO_INPUTS = 16;

function mintermText(m: number, n: number): string {
  return m.toString(2).padStart(n, '0');
}

/** Type-fd PLA of one non-constant output: on-set rows "…1", don't-care rows "…-". */
export function buildPla(out: OutputTable, n: number): string[] {
  const lines = [`.i ${n}`, '.o 1', '.type fd'];
  for (const m of mintermsOf(out.on, n)) lines.push(`${mintermText(m, n)} 1`);
  for (const m of mintermsOf(out.dc, n)) lines.push(`${mintermText(m, n)} -`);
  lines.push('.e');
  return lines;
}

/** Why a PLA must not be sent, or undefined when it is safe. */
export function plaProblem(lines: string[]): string | undefined {
  const iLine = /^\.i (\d+)$/.exec(lines[0] ?? '');
  const oLine = /^\.o (\d+)$/.exec(lines[1] ?? '');
  if (!iLine || !oLine) return 'a PLA must start with ".i N" and ".o M"';
  const n = Number(iLine[1]);
  const o = Number(oLine[1]);
  if (n < 1 || n > MAX_ESPRESSO_INPUTS) return `.i ${n} is outside 1..${MAX_ESPRESSO_INPUTS}`;
  if (o < 1 || o > 64) return `.o ${o} is outside 1..64`;
  if (lines[lines.length - 1] !== '.e') return 'a PLA must end with ".e"';
  const row = new RegExp(`^[01-]{${n}} [01~-]{${o}}$`);
  let rows = 0;
  let onRows = 0;
  for (let k = 2; k < lines.length - 1; k++) {
    const line = lines[k];
    if (/^\.type (f|fd|fr|fdr)$/.test(line) && k === 2) continue;
    if (!row.test(line)) return `line ${k + 1} "${line.slice(0, 40)}" is not a row of ${n} inputs and ${o} outputs`;
    rows++;
    if (line.slice(n + 1).includes('1')) onRows++;
  }
  // A PLA with no product rows corrupts the next call inside the native code.
  if (rows === 0 || onRows === 0) return 'a PLA with no on-set rows is never sent (the function is constant)';
  return undefined;
}

/** Parses Espresso's single-output cube lines ("1-0 1") into a cover. */
export function parseCubes(lines: string[], n: number): Cover {
  const row = new RegExp(`^([01-]{${n}}) 1$`);
  return lines.map((line) => {
    const m = row.exec(line.trim());
    if (!m) throw new InternalError(`unexpected line from the minimiser: "${line.slice(0, 60)}"`);
    return cubeFromString(m[1], n);
  });
}
