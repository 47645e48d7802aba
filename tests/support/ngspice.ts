// Runs ngspice (the Debian package; scripts/test.sh installs it) in batch mode on a deck and
// returns the vectors it wrote with `wrdata`, parsed from the table (never from paginated .print).
// operatingPoints() batches one DC operating point per input combination into a single run.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

export interface NgspiceRun {
  /** One row per wrdata call (or per sweep point), vector name (lower case) → value. */
  rows: Record<string, number>[];
  log: string;
}

/** Placeholder a deck uses for the wrdata file: `wrdata {out} v(y)`. */
export const OUT = '{out}';

/** Parses a wrdata table written with `wr_vecnames`: header lines name the columns that follow. */
export function parseWrdata(text: string): Record<string, number>[] {
  const rows: Record<string, number>[] = [];
  let names: string[] = [];
  for (const line of text.split(/\r?\n/)) {
    const cells = line.trim().split(/\s+/).filter(Boolean);
    if (cells.length === 0) continue;
    const nums = cells.map(Number);
    if (nums.some((x) => Number.isNaN(x))) {
      names = cells.map((c) => c.toLowerCase());
      continue;
    }
    if (names.length !== nums.length) throw new Error(`wrdata row has ${nums.length} values for ${names.length} names: ${line}`);
    rows.push(Object.fromEntries(names.map((n, i) => [n, nums[i]])));
  }
  return rows;
}

/** Runs a deck whose `.control` block writes with `wrdata {out} …` (set wr_vecnames, appendwrite). */
export function runNgspice(deck: string, timeoutMs = 30_000): NgspiceRun {
  const dir = mkdtempSync(path.join(tmpdir(), 'tw-ngspice-'));
  try {
    const out = path.join(dir, 'out.txt');
    const file = path.join(dir, 'deck.cir');
    writeFileSync(file, deck.split(OUT).join(out));
    const r = spawnSync('ngspice', ['-b', file], { encoding: 'utf8', timeout: timeoutMs, cwd: dir });
    const log = `${r.stdout ?? ''}\n${r.stderr ?? ''}`;
    if (r.error) throw new Error(`ngspice did not run: ${r.error.message}`);
    // ngspice exits 1 in batch mode when the deck has no .print/.plot; errors are in the log.
    const bad = log.split('\n').filter((l) => /^\s*(error|fatal)/i.test(l) || /singular matrix|timestep too small|no convergence/i.test(l));
    if (bad.length) throw new Error(`ngspice reported: ${bad.slice(0, 5).join(' | ')}`);
    if (!existsSync(out)) throw new Error(`ngspice wrote no data; log:\n${log.slice(0, 2000)}`);
    return { rows: parseWrdata(readFileSync(out, 'utf8')), log };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export interface OperatingPointOptions {
  /** Input nets to drive from ideal sources, with one value (volts) per net per combination. */
  combinations: Record<string, number>[];
  /** Nets whose voltages to read back. */
  probe: string[];
  /** Extra vectors (e.g. `i(vvcc)`) to read. */
  extra?: string[];
}

/**
 * DC operating point of a written deck (title first, `.end` last) for each input combination,
 * in one ngspice run: the inputs get sources, then `alter` + `op` + `wrdata` per combination.
 * Returns, per combination, net name (as given) → volts, plus the extra vectors.
 */
export function operatingPoints(deck: string, o: OperatingPointOptions): Record<string, number>[] {
  if (o.combinations.length === 0) return [];
  const inputs = Object.keys(o.combinations[0]);
  const body = deck.replace(/^\s*\.end\s*$/im, '').replace(/^\s*\.(op|tran|dc|ac)\b.*$/gim, '');
  const src = (n: string) => `VTW_${n.replace(/[^A-Za-z0-9_]/g, '_')}`;
  const vectors = [...o.probe.map((n) => `v(${n})`), ...(o.extra ?? [])];
  const lines = [body.trimEnd(), ...inputs.map((n) => `${src(n)} ${n} 0 DC 0`), '.control', 'set wr_vecnames', 'set appendwrite'];
  for (const combo of o.combinations) {
    for (const n of inputs) lines.push(`alter ${src(n)} dc=${combo[n]}`);
    lines.push('op', `wrdata ${OUT} ${vectors.join(' ')}`);
  }
  lines.push('.endc', '.end', '');
  const run = runNgspice(lines.join('\n'));
  if (run.rows.length !== o.combinations.length) {
    throw new Error(`ngspice gave ${run.rows.length} operating points for ${o.combinations.length} combinations`);
  }
  return run.rows.map((row) => {
    const out: Record<string, number> = {};
    o.probe.forEach((n) => (out[n] = row[`v(${n.toLowerCase()})`] ?? row[n.toLowerCase()]));
    for (const e of o.extra ?? []) out[e] = row[e.toLowerCase()];
    for (const [k, val] of Object.entries(out)) if (val === undefined || Number.isNaN(val)) throw new Error(`ngspice gave no value for ${k}`);
    return out;
  });
}

/** Every combination of the given inputs at the two levels (low, high). */
export function allCombinations(inputs: string[], low: number, high: number): Record<string, number>[] {
  const out: Record<string, number>[] = [];
  for (let m = 0; m < 1 << inputs.length; m++) out.push(Object.fromEntries(inputs.map((n, i) => [n, (m >> i) & 1 ? high : low])));
  return out;
}

/** Logic level of a voltage against input thresholds: 0 below V_IL, 1 above V_IH, 'X' between. */
export function levelOf(volts: number, vil: number, vih: number): 0 | 1 | 'X' {
  return volts <= vil ? 0 : volts >= vih ? 1 : 'X';
}
