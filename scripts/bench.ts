// `npm run bench`: generated bit-sliced designs of 10k, 100k and 1M transistors, each size run in
// its own child process for clean peak-memory numbers. The deck is written by the parent (not
// timed); the child times each stage and reports its peak resident memory. Prints a table, then
// the scan with all rules per size (each in a child with a time budget) and the two-level
// minimiser's overhead over the bare Espresso call. `--skip-scan`, `--skip-minimise` leave those out.
//
// Reading the table: one row per generated design ("10k hier" = about 10,000 transistors, one
// slice subcircuit instantiated per bit; "flat" = every device written out in the deck). Each
// stage column is "wall / cpu" seconds: wall-clock time and the processor time (user + system,
// GC threads included) the child spent in that stage — on a shared, loaded machine the cpu figure
// is the one to compare between runs. "total" sums the stages the same way; "cpu µs/device" is
// the total processor time per flat device, and staying roughly flat from 10k to 1M is the sign
// that no stage is quadratic. "RSS to extract MiB" is the child's peak resident memory through
// parse, flatten and extract (the 3 GB goal); "peak RSS MiB" includes the simulation, which builds
// its own switch model while the logic view is still held.
// Goals (issue 3): 100k parsed and extracted in under 3 s; 1M in under 30 s within 3 GB.
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import path from 'node:path';
import { readSpice } from '@/optimizer/formats/spice/read';
import { writeSpice } from '@/optimizer/formats/spice/write';
import { flatten } from '@/optimizer/netlist/flatten';
import { generateBitSliced, slicesFor, type Family } from '@/optimizer/netlist/generate';
import type { Design, FlatNetlist } from '@/optimizer/netlist/ir';
import { extractLogic } from '@/optimizer/extract/index';
import { SwitchSimulator } from '@/optimizer/verify/switch-sim';
import { createEspressoMinimiser } from '@/optimizer/logic/espresso/espresso-minimiser';
import { scan } from '@/optimizer/rules/scan';

/** What the stages share; each stage reads what earlier ones left and may add its own result. */
interface BenchContext {
  text: string;
  design?: Design;
  flat?: FlatNetlist;
  /** Devices the stage handled, for the per-device column. */
  devices: number;
  [key: string]: unknown;
}

interface Stage {
  name: string;
  run(ctx: BenchContext): void;
}

/**
 * The benchmarked stages, in order. Later analyses (logic extraction, switch-level simulation of
 * 1000 steps) add themselves here as further entries; the table grows a column for each.
 */
const STAGES: Stage[] = [
  {
    name: 'parse',
    run(ctx) {
      ctx.design = readSpice(ctx.text, 'bench.cir').design;
    },
  },
  {
    name: 'flatten',
    run(ctx) {
      ctx.flat = flatten(ctx.design!);
      ctx.devices = ctx.flat.devices.length;
      // The parsed cells are not needed once flattened (the product drops them too): a 1M-device
      // flat deck's cells would otherwise stay in the heap every later collection walks.
      ctx.design = undefined;
    },
  },
  {
    name: 'extract',
    run(ctx) {
      ctx.view = extractLogic(ctx.flat!);
    },
  },
  {
    // 1000 switch-level steps: the shared LOAD strobe toggles every 10th step (every slice's
    // enable, data gating, line and output then move); the other steps change nothing and cost
    // only the event queue.
    name: 'simulate 1000 steps',
    run(ctx) {
      const sim = new SwitchSimulator(ctx.flat!, ['LOAD'], {});
      for (let step = 0; step < 1000; step++) sim.apply({ LOAD: Math.floor(step / 10) % 2 ? 1 : 0 });
      ctx.simulated = sim.result;
    },
  },
];

interface Case {
  label: string;
  transistors: number;
  family: Family;
  flat: boolean;
}

const SIZES = [10_000, 100_000, 1_000_000];
const CASES: Case[] = SIZES.flatMap((n) =>
  (['hier', 'flat'] as const).map((form) => ({ label: `${n >= 1e6 ? n / 1e6 + 'M' : n / 1e3 + 'k'} ${form}`, transistors: n, family: 'rtl' as Family, flat: form === 'flat' })),
);

interface ChildResult {
  times: Record<string, number>;
  /** Processor seconds (user + system, all threads) per stage: steadier than wall time on a shared machine. */
  cpu: Record<string, number>;
  devices: number;
  peakRssMiB: number;
  /** Peak resident memory once each stage had finished (the peak is monotonic). */
  rssAfter: Record<string, number>;
}

function child(deckPath: string, stages: Stage[]): void {
  const ctx: BenchContext = { text: readFileSync(deckPath, 'utf8'), devices: 0 };
  const times: Record<string, number> = {};
  const cpu: Record<string, number> = {};
  const rssAfter: Record<string, number> = {};
  for (const s of stages) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    s.run(ctx);
    times[s.name] = (performance.now() - t0) / 1000;
    const c = process.cpuUsage(c0);
    cpu[s.name] = (c.user + c.system) / 1e6;
    rssAfter[s.name] = process.resourceUsage().maxRSS / 1024;
  }
  const result: ChildResult = { times, cpu, devices: ctx.devices, peakRssMiB: process.resourceUsage().maxRSS / 1024, rssAfter };
  process.stdout.write(JSON.stringify(result) + '\n');
}

/** `--stages parse,flatten` runs only those stages (in table order); the default runs them all. */
function selectedStages(argv: string[]): Stage[] {
  const i = argv.indexOf('--stages');
  if (i < 0) return STAGES;
  const names = (argv[i + 1] ?? '').split(',');
  const picked = STAGES.filter((s) => names.includes(s.name));
  if (picked.length === 0) throw new Error(`--stages takes names from: ${STAGES.map((s) => s.name).join(', ')}`);
  return picked;
}

/** Scan sizes (transistors, hierarchical RTL bit slices) and the wall-clock budget of each child. */
const SCAN_SIZES = [1_000, 2_000, 10_000, 100_000, 1_000_000];
const SCAN_BUDGET_S = Number(process.env.BENCH_SCAN_BUDGET_S ?? 180);

interface ScanChildResult {
  devices: number;
  prepare: number;
  scan: number;
  /** Processor time of the scan (main thread and helpers of this process; GC threads included). */
  scanCpu: number;
  findings: number;
  verdicts: Record<string, number>;
  ruleErrors: number;
  peakRssMiB: number;
}

/** Child: parse, flatten and extract (the "prepare" column), then scan with every rule. */
async function scanChild(deckPath: string): Promise<void> {
  let t0 = performance.now();
  const flat = flatten(readSpice(readFileSync(deckPath, 'utf8'), 'bench.cir').design);
  const view = extractLogic(flat);
  const prepare = (performance.now() - t0) / 1000;
  const minimiser = createEspressoMinimiser({ size: 1 });
  try {
    t0 = performance.now();
    const cpu0 = process.cpuUsage();
    const r = await scan(flat, { view, minimiser });
    const seconds = (performance.now() - t0) / 1000;
    const cpu = process.cpuUsage(cpu0);
    const verdicts: Record<string, number> = {};
    for (const f of r.findings) for (const p of f.proposals) verdicts[p.verdict] = (verdicts[p.verdict] ?? 0) + 1;
    const result: ScanChildResult = {
      devices: flat.devices.length,
      prepare,
      scan: seconds,
      scanCpu: (cpu.user + cpu.system) / 1e6,
      findings: r.findings.length,
      verdicts,
      ruleErrors: r.ruleErrors.length,
      peakRssMiB: process.resourceUsage().maxRSS / 1024,
    };
    process.stdout.write(JSON.stringify(result) + '\n');
  } finally {
    minimiser.close();
  }
}

function printTable(header: string[], rows: string[][]): void {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((x, i) => (i === 0 ? x.padEnd(widths[i]) : x.padStart(widths[i]))).join('  ');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows) console.log(line(r));
}

interface DeckSpec {
  transistors: number;
  family: Family;
  flat: boolean;
}

/**
 * Writes a generated deck from a child process of its own. Generating a 1M-transistor design
 * leaves a heap of garbage behind; in this process its collection would carry on in the engine's
 * background threads while the measured child runs, taking one of the two cores from it (the 1M
 * flat stages measured 2–5 s slower that way).
 */
function writeDeck(deckPath: string, spec: DeckSpec): void {
  const run = spawnSync(process.execPath, [...process.execArgv, __filename, '--write-deck', deckPath, JSON.stringify(spec)], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`writing ${deckPath} failed (status ${run.status ?? run.signal}): ${run.stderr}`);
}

function writeDeckChild(deckPath: string, spec: DeckSpec): void {
  writeFileSync(deckPath, writeSpice(generateBitSliced({ slices: slicesFor(spec.transistors, spec.family), family: spec.family, flat: spec.flat })));
}

/** Scan with all rules per size; once a size exceeds its budget the larger ones are not started. */
function scanSection(dir: string): void {
  // The scan's processor time is the figure to compare on a shared machine; wall time is beside it.
  const header = ['design', 'devices', 'prepare s', 'scan s', 'scan cpu s', 'findings', 'verdicts', 'rule errors', 'peak RSS MiB'];
  const rows: string[][] = [];
  let over = false;
  for (const n of SCAN_SIZES) {
    const label = `${n >= 1e6 ? n / 1e6 + 'M' : n / 1e3 + 'k'} hier`;
    if (over) {
      rows.push([label, '', '', `not run (a smaller size exceeded ${SCAN_BUDGET_S} s)`, '', '', '', '', '']);
      continue;
    }
    const deckPath = path.join(dir, `scan-${n}.cir`);
    writeDeck(deckPath, { transistors: n, family: 'rtl', flat: false });
    const run = spawnSync(process.execPath, [...process.execArgv, __filename, '--scan-child', deckPath], {
      encoding: 'utf8',
      maxBuffer: 16 * 1024 * 1024,
      timeout: SCAN_BUDGET_S * 1000,
      killSignal: 'SIGKILL',
    });
    if (run.error || run.status !== 0) {
      const stopped = run.signal === 'SIGKILL' || (run.error as NodeJS.ErrnoException | undefined)?.code === 'ETIMEDOUT';
      rows.push([label, '', '', stopped ? `> ${SCAN_BUDGET_S} (stopped)` : `failed (status ${run.status})`, '', '', '', '', '']);
      if (!stopped) process.stderr.write(`${label}: scan child failed\n${run.stderr}\n`);
      over = true;
      continue;
    }
    const r = JSON.parse(run.stdout.trim().split('\n').pop()!) as ScanChildResult;
    rows.push([
      label,
      r.devices.toLocaleString('en-US'),
      r.prepare.toFixed(2),
      r.scan.toFixed(2),
      r.scanCpu.toFixed(2),
      String(r.findings),
      Object.entries(r.verdicts).map(([k, x]) => `${k} ${x}`).join(', ') || '—',
      String(r.ruleErrors),
      r.peakRssMiB.toFixed(0),
    ]);
    process.stderr.write(`done scan ${label}\n`);
  }
  console.log('');
  console.log(`Scan with all rules (RTL bit slices, hierarchical; goal: 100k transistors under 10 s, 1M under 2 min, under 4 GB; budget ${SCAN_BUDGET_S} s a size)`);
  printTable(header, rows);
}

/**
 * The two-level minimiser's table (its own script, so it can also be run alone), twice: with the
 * two processes where the scheduler puts them, and both held on one processor. On a virtual
 * machine whose processors run at different speeds for seconds at a time, the first compares the
 * child's processor with this one as much as the two calls; the second compares the calls alone.
 */
function minimiseSection(): void {
  const script = [...process.execArgv, path.resolve(__dirname, '../optimizer/logic/espresso/bench-minimise.ts')];
  console.log('');
  console.log('two-level-minimise against the bare Espresso call (function and complement; goal: processor-time overhead under 30 % at 8–14 inputs, batched and alone)');
  const show = (run: ReturnType<typeof spawnSync>, title = '') =>
    process.stdout.write(run.status === 0 ? `${title}${String(run.stdout)}` : `failed (status ${run.status})\n${String(run.stderr)}\n`);
  show(spawnSync(process.execPath, script, { encoding: 'utf8' }));
  console.log('');
  const pinned = spawnSync('taskset', ['--cpu-list', '0', process.execPath, ...script, '--brief'], { encoding: 'utf8' });
  if (pinned.error) console.log(`both processes on processor 0: not measured (taskset: ${pinned.error.message})`);
  else show(pinned, 'both processes on processor 0 (taskset):\n');
}

function parent(): void {
  const dir = path.resolve(__dirname, '../bench-results');
  mkdirSync(dir, { recursive: true });
  const argv = process.argv.slice(2);
  const stages = selectedStages(argv);
  const stageArg = argv.includes('--stages') ? ['--stages', stages.map((s) => s.name).join(',')] : [];
  const only = argv.filter((a, i) => !a.startsWith('--') && argv[i - 1] !== '--stages');
  const cases = only.length > 0 ? CASES.filter((c) => only.some((o) => c.label.startsWith(o))) : CASES;
  const header = ['design', 'devices', 'deck MiB', ...stages.map((s) => `${s.name} s`), 'total s', 'cpu µs/device', 'RSS to extract MiB', 'peak RSS MiB'];
  const widths = header.map((h) => Math.max(h.length, 13));
  const line = (cells: string[]) => cells.map((x, i) => (i === 0 ? x.padEnd(widths[i]) : x.padStart(widths[i]))).join('  ');
  console.log(`Trimwire bench — ${process.version}, ${new Date().toISOString()}, load average ${loadavg().map((x) => x.toFixed(1)).join(' ')} on ${cpus().length} cores`);
  console.log('RTL bit-sliced designs ("hier": one slice subcircuit instantiated; "flat": every device in the deck)');
  console.log('each time is "wall / cpu" seconds: wall clock, then processor time of the child (GC threads included)');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const c of cases) {
    const deckPath = path.join(dir, `${c.label.replace(' ', '-')}.cir`);
    writeDeck(deckPath, c);
    const run = spawnSync(process.execPath, [...process.execArgv, __filename, '--child', deckPath, ...stageArg], {
      encoding: 'utf8',
      maxBuffer: 16 * 1024 * 1024,
    });
    if (run.status !== 0) {
      console.log(line([c.label, `child failed (status ${run.status ?? run.signal})`]));
      process.stderr.write(`${run.stderr}\n`);
      process.exitCode = 1;
      continue;
    }
    const r = JSON.parse(run.stdout.trim().split('\n').pop()!) as ChildResult;
    const total = Object.values(r.times).reduce((a, b) => a + b, 0);
    const totalCpu = Object.values(r.cpu).reduce((a, b) => a + b, 0);
    const pair = (wall: number, cpu: number) => `${wall.toFixed(2)} / ${cpu.toFixed(2)}`;
    console.log(
      line([
        c.label,
        r.devices.toLocaleString('en-US'),
        (statSync(deckPath).size / 2 ** 20).toFixed(1),
        ...stages.map((s) => pair(r.times[s.name], r.cpu[s.name])),
        pair(total, totalCpu),
        ((totalCpu * 1e6) / r.devices).toFixed(2),
        r.rssAfter.extract !== undefined ? r.rssAfter.extract.toFixed(0) : '-',
        r.peakRssMiB.toFixed(0),
      ]),
    );
  }
  if (!argv.includes('--skip-scan')) scanSection(dir);
  if (!argv.includes('--skip-minimise')) minimiseSection();
}

if (process.argv[2] === '--child') child(process.argv[3], selectedStages(process.argv));
else if (process.argv[2] === '--write-deck') writeDeckChild(process.argv[3], JSON.parse(process.argv[4]) as DeckSpec);
else if (process.argv[2] === '--scan-child') {
  scanChild(process.argv[3]).catch((e: unknown) => {
    process.stderr.write(String(e instanceof Error ? e.stack : e) + '\n');
    process.exitCode = 1;
  });
} else parent();
