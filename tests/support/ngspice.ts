// Runs SPICE-style decks in ngspice batch mode for tests and parses the vectors they write with
// `wrdata` (one header line of vector names, then rows) — never the paginated `.print` output.
// operatingPoints() batches every input combination of a deck into one run with `alter` lines.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** One row of a wrdata table: vector name (lower case, as ngspice spells it) → value. */
export type VectorRow = Record<string, number>;

export interface NgspiceRun {
  /** Every row every `wrdata @OUT …` line wrote, in order. */
  rows: VectorRow[];
  stdout: string;
}

export class NgspiceError extends Error {
  constructor(
    message: string,
    readonly output: string,
  ) {
    super(message);
    this.name = 'NgspiceError';
  }
}

const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$|^[-+]?(nan|inf)$/i;

/** Parses wrdata text: a header of names (wr_vecnames) followed by numeric rows, repeated. */
export function parseWrdata(text: string): VectorRow[] {
  const rows: VectorRow[] = [];
  let header: string[] | undefined;
  for (const raw of text.split(/\r?\n/)) {
    const tokens = raw.trim().split(/\s+/).filter(Boolean);
    if (tokens.length === 0) continue;
    if (!tokens.every((t) => NUMBER.test(t))) {
      header = tokens.map((t) => t.toLowerCase());
      continue;
    }
    if (!header) throw new NgspiceError('wrdata output has values before any header (set wr_vecnames)', text);
    if (tokens.length !== header.length) {
      throw new NgspiceError(`wrdata row has ${tokens.length} values for ${header.length} names: ${raw.trim()}`, text);
    }
    const row: VectorRow = {};
    header.forEach((name, i) => (row[name] = Number(tokens[i])));
    rows.push(row);
  }
  return rows;
}

/**
 * Runs `deck` (full text, title line first, ending in `.end`) with `ngspice -b`. Inside its
 * `.control` block, `@OUT` names the file wrdata appends to; the parsed rows are returned.
 * End the block with `quit` (ngspice otherwise exits non-zero with a "no simulations" note).
 * ngspice errors (a line starting "Error") or a missing output file throw NgspiceError.
 */
export function runNgspice(deck: string, options: { timeoutMs?: number } = {}): NgspiceRun {
  const dir = mkdtempSync(path.join(tmpdir(), 'tw-ngspice-'));
  try {
    const out = path.join(dir, 'out.txt');
    const file = path.join(dir, 'deck.cir');
    writeFileSync(file, deck.replace(/@OUT/g, out));
    let stdout: string;
    try {
      stdout = execFileSync('ngspice', ['-b', file], {
        encoding: 'utf8',
        stdio: ['ignore', 'pipe', 'pipe'],
        timeout: options.timeoutMs ?? 30_000,
        cwd: dir,
      });
    } catch (err) {
      const e = err as { stdout?: string; stderr?: string; message: string };
      throw new NgspiceError(`ngspice failed: ${e.message}`, `${e.stdout ?? ''}\n${e.stderr ?? ''}`);
    }
    const bad = stdout.split(/\r?\n/).find((l) => /^\s*error/i.test(l));
    if (bad) throw new NgspiceError(`ngspice reported: ${bad.trim()}`, stdout);
    if (!existsSync(out)) throw new NgspiceError('ngspice wrote no wrdata output', stdout);
    return { rows: parseWrdata(readFileSync(out, 'utf8')), stdout };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export interface OperatingPointRequest {
  /** Deck text as written (title first); a trailing `.end` and any `.control` block are replaced. */
  deck: string;
  /** Input nets driven by added DC sources, named as in the deck. */
  inputs: string[];
  /** One entry per operating point: input net → volts (every input listed). */
  points: Record<string, number>[];
  /** Vectors to record, e.g. "v(y)", "i(vcc)". */
  probes: string[];
}

/** DC operating point at every point in one ngspice run: `alter` the input sources, `op`, `wrdata`. */
export function operatingPoints(req: OperatingPointRequest): VectorRow[] {
  if (req.points.length === 0) return [];
  const body = req.deck
    .replace(/^\s*\.control[\s\S]*?^\s*\.endc\s*$/gim, '')
    .replace(/^\s*\.end\s*$/gim, '')
    .trimEnd();
  const sourceOf = (net: string, i: number) => `VTWIN${i}`;
  const sources = req.inputs.map((net, i) => `${sourceOf(net, i)} ${net} 0 DC ${req.points[0][net] ?? 0}`);
  const control = ['.control', 'set wr_vecnames', 'set wr_singlescale', 'set appendwrite'];
  for (const point of req.points) {
    req.inputs.forEach((net, i) => {
      const volts = point[net];
      if (volts === undefined || !Number.isFinite(volts)) throw new Error(`operating point lacks a value for input ${net}`);
      control.push(`alter ${sourceOf(net, i)} = ${volts}`);
    });
    control.push('op', `wrdata @OUT ${req.probes.join(' ')}`);
  }
  // `quit` ends the batch run cleanly (exit status 0) instead of ngspice's "no simulations" note.
  control.push('quit', '.endc');
  const { rows } = runNgspice([body, ...sources, ...control, '.end', ''].join('\n'));
  if (rows.length !== req.points.length) {
    throw new NgspiceError(`expected ${req.points.length} operating points, ngspice wrote ${rows.length}`, '');
  }
  return rows;
}

/** Every 0/1 combination of `names` (first name = most significant bit). */
export function allCombinations(names: string[]): Record<string, 0 | 1>[] {
  const out: Record<string, 0 | 1>[] = [];
  for (let m = 0; m < 2 ** names.length; m++) {
    out.push(Object.fromEntries(names.map((n, i) => [n, ((m >> (names.length - 1 - i)) & 1) as 0 | 1])));
  }
  return out;
}
