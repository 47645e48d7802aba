// The `trimwire` command line: the one engine file that touches files and the terminal. Commands
// live in one table (name → usage, options, run) so more can be added beside these. scan and
// apply run the rules with the Espresso process pool, which is closed when the command ends.
// Exit codes: 0 done (warnings allowed), 1 usage error, 2 input errors, 3 internal error.
import { readFileSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { InputError, formatDiagnostic, type Diagnostic } from './errors';
import { FORMATS, formatFromName, readDesign, writeDesign, type ReadResult } from './formats/index';
import { parseSpiceNumber } from './formats/spice/numbers';
import { assumptionNets, witnessAssumptions } from './logic/assumptions';
import { createEspressoMinimiser } from './logic/espresso/espresso-minimiser';
import { parseExpr } from './logic/expr-parse';
import type { MapFamily } from './logic/family-parts';
import type { MarginResult } from './margins/corners';
import { countFlat, countParts, type PartCounts } from './netlist/counts';
import { flatten } from './netlist/flatten';
import type { FlatNetlist, Format } from './netlist/ir';
import { applyProposals, flatToDesign } from './rewrite/apply';
import { scan, type ScanResult, type ScannedProposal } from './rules/scan';
import type { Assumption, Finding } from './rules/types';

export interface CliIo {
  readFile(path: string): Uint8Array;
  /** Writes the whole text or nothing (temporary file, then rename). */
  writeFile(path: string, text: string): void;
  stdout(text: string): void;
  stderr(text: string): void;
}

export interface ParsedArgs {
  positional: string[];
  options: Record<string, string | true>;
  /** Values of repeatable options, in the order given. */
  lists: Record<string, string[]>;
}

export interface Command {
  name: string;
  aliases?: string[];
  usage: string;
  summary: string;
  /** Options taking a value; others are flags. */
  valued?: string[];
  /** Options taking a value that may be given several times. */
  repeatable?: string[];
  flags?: string[];
  run(args: ParsedArgs, io: CliIo): number | Promise<number>;
}

class UsageError extends Error {}

function formatOption(args: ParsedArgs, name: string): Format | undefined {
  const v = args.options[name];
  if (v === undefined) return undefined;
  if (typeof v !== 'string' || !(FORMATS as readonly string[]).includes(v)) throw new UsageError(`--${name} must be one of ${FORMATS.join(', ')}`);
  return v as Format;
}

function oneFile(args: ParsedArgs, command: string): string {
  if (args.positional.length !== 1) throw new UsageError(`${command} takes one FILE`);
  return args.positional[0];
}

function load(file: string, args: ParsedArgs, io: CliIo): ReadResult {
  let bytes: Uint8Array;
  try {
    bytes = io.readFile(file);
  } catch (e) {
    throw InputError.at('input.unreadable', `cannot read the file: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`, { file, line: 1, col: 1 });
  }
  return readDesign(bytes, { file, format: formatOption(args, 'format') });
}

/** The design read and flattened, its warnings printed; the parsed cells are left to the collector (a scan of a large flat deck would otherwise keep them all). */
function loadFlat(file: string, args: ParsedArgs, io: CliIo): FlatNetlist {
  const { design, diagnostics } = load(file, args, io);
  printWarnings(diagnostics, io);
  return flatten(design);
}

function printWarnings(diags: Diagnostic[], io: CliIo): void {
  for (const d of diags) if (d.severity === 'warning') io.stderr(formatDiagnostic(d) + '\n');
}

function partsLine(c: PartCounts): string {
  return `${c.transistors} transistors, ${c.resistors} resistors, ${c.diodes} diodes, ${c.capacitors} capacitors, ${c.gates} gates`;
}


const FAMILIES: readonly MapFamily[] = ['rtl', 'dtl', 'cmos', 'nmos'];

interface ScanRun {
  file: string;
  flat: FlatNetlist;
  assumptions: Assumption[];
  result: ScanResult;
}

/** --assume texts as assumptions A1, A2, … over the design's nets; refused when unknown or contradictory. */
function assumptionsFrom(args: ParsedArgs, flat: FlatNetlist): Assumption[] {
  const list = (args.lists.assume ?? []).map((text, i) => ({ id: `A${i + 1}`, text, expr: parseExpr(text, `--assume ${i + 1}`) }));
  const unknown = assumptionNets(list.map((a) => ({ name: a.id, expr: a.expr }))).filter((n) => !flat.netByName.has(n));
  if (unknown.length) throw InputError.at('assume.unknown-net', `--assume names net(s) the design does not have: ${unknown.slice(0, 8).join(', ')}`);
  witnessAssumptions(list.map((a) => ({ name: a.id, expr: a.expr })));
  return list;
}

async function runScan(args: ParsedArgs, io: CliIo, command: string): Promise<ScanRun> {
  const file = oneFile(args, command);
  const rules = typeof args.options.rules === 'string' ? args.options.rules.split(',').map((r) => r.trim()).filter(Boolean) : undefined;
  let clockPeriod: number | undefined;
  if (typeof args.options['clock-period'] === 'string') {
    clockPeriod = parseSpiceNumber(args.options['clock-period']);
    if (clockPeriod === undefined || !(clockPeriod > 0)) throw new UsageError('--clock-period must be a positive time such as 1us or 250n');
  }
  const family = args.options.family;
  if (family !== undefined && (typeof family !== 'string' || !(FAMILIES as readonly string[]).includes(family))) throw new UsageError(`--family must be one of ${FAMILIES.join(', ')}`);
  const flat = loadFlat(file, args, io);
  const assumptions = assumptionsFrom(args, flat);
  const minimiser = createEspressoMinimiser({ size: 1 });
  try {
    const result = await scan(flat, {
      assumptions,
      ...(rules ? { enabled: rules } : {}),
      ...(clockPeriod !== undefined ? { clockPeriod } : {}),
      ...(family ? { targetFamily: family as MapFamily } : {}),
      minimiser,
    });
    return { file, flat, assumptions, result };
  } finally {
    minimiser.close();
  }
}

/** Three significant digits for the table (the JSON keeps full precision). */
const num = (x: number) => String(Number(x.toPrecision(3)));

const cornerText = (m: MarginResult) => `${m.corner.supply} V, ${m.corner.resistors}${m.corner.beta !== undefined ? `, β ${m.corner.beta}` : ''}`;

/** One row per proposal (a finding with alternatives has one per alternative), in the JSON shape. */
function findingJson(f: Finding, p: ScannedProposal, flat: FlatNetlist) {
  const gateLevel = flat.devices.some((d) => d.kind === 'gate');
  const { gates, capacitors: _c, ...discrete } = p.savings;
  const v = p.verification;
  return {
    id: p.proposal.id,
    finding: f.id,
    rule: f.ruleId,
    title: p.proposal.title,
    message: f.message,
    at: [...f.location.devices, ...f.location.instances],
    savings: gateLevel ? { ...discrete, gates } : discrete,
    verification: {
      status: v.status,
      method: v.method,
      assumptions: v.assumptions,
      ...(v.counterexample ? { counterexample: v.counterexample } : {}),
      ...(v.note ? { note: v.note } : {}),
    },
    margins: p.margins.map((m) => ({ name: m.name, value: m.value, limit: m.limit, unit: m.unit, status: m.status, corner: cornerText(m) })),
    verdict: p.verdict,
  };
}

function scanJson(run: ScanRun) {
  return {
    parts: countFlat(run.flat),
    assumptions: run.assumptions.map((a) => ({ id: a.id, text: a.text })),
    findings: run.result.findings.flatMap((f) => f.proposals.map((p) => findingJson(f.finding, p, run.flat))),
    ruleErrors: run.result.ruleErrors,
  };
}

function table(rows: string[][]): string {
  const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
  return rows.map((r) => r.map((x, c) => x.padEnd(widths[c])).join('  ').trimEnd()).join('\n') + '\n';
}

function scanText(run: ScanRun): string {
  const j = scanJson(run);
  let out = `${run.file}: ${partsLine(j.parts)}\n`;
  for (const a of j.assumptions) out += `  assuming ${a.id}: ${a.text}\n`;
  if (j.findings.length === 0) out += 'no findings\n';
  else {
    const rows = [['id', 'rule', 'verdict', 'proof', 'saves T/R/D', 'cost', 'worst margin']];
    for (const f of j.findings) {
      const worst = [...f.margins].sort((a, b) => ['fail', 'warn', 'pass'].indexOf(a.status) - ['fail', 'warn', 'pass'].indexOf(b.status))[0];
      rows.push([
        f.id,
        f.rule,
        f.verdict,
        `${f.verification.status} (${f.verification.method}${f.verification.assumptions.length ? `; ${f.verification.assumptions.join(', ')}` : ''})`,
        `${f.savings.transistors}/${f.savings.resistors}/${f.savings.diodes}`,
        f.savings.cost.toFixed(2),
        worst ? `${worst.name} ${worst.status} (${num(worst.value)} / ${num(worst.limit)} ${worst.unit})` : '—',
      ]);
    }
    out += table(rows);
    for (const f of j.findings) {
      out += `\n${f.id}: ${f.message}\n`;
      if (f.verification.counterexample) out += `  counterexample: ${Object.entries(f.verification.counterexample).map(([k, x]) => `${k}=${x}`).join(' ')}\n`;
      if (f.verification.note) out += `  note: ${f.verification.note}\n`;
      for (const m of f.margins) out += `  ${m.status.padEnd(4)} ${m.name}: ${num(m.value)} ${m.unit} (limit ${num(m.limit)}; ${m.corner})\n`;
    }
    out += '\ncost in the parts table\'s invented demo prices; margins are estimates at worst-case corners — check them against the parts\' data sheets before building.\n';
  }
  for (const e of j.ruleErrors) out += `rule error (${e.ruleId}): ${e.message}\n`;
  return out;
}

export const COMMANDS: Command[] = [
  {
    name: 'check',
    usage: 'check FILE [--format spice|verilog|json|pla]',
    summary: 'read, validate and flatten a design; one line per problem as FILE:LINE:COL: message',
    valued: ['format'],
    run(args, io) {
      const file = oneFile(args, 'check');
      const { design, diagnostics } = load(file, args, io);
      const flat = flatten(design);
      printWarnings(diagnostics, io);
      const warnings = diagnostics.filter((d) => d.severity === 'warning').length;
      const c = countParts(design);
      io.stdout(
        `${file}: ok (${design.format}) — ${flat.devices.length} devices, ${flat.nets.length} nets, ${flat.rails.length} rails; ${partsLine(c)}` +
          `${warnings > 0 ? `; ${warnings} warning${warnings === 1 ? '' : 's'}` : ''}\n`,
      );
      return 0;
    },
  },
  {
    name: 'count',
    aliases: ['counts'],
    usage: 'count FILE [--json] [--format spice|verilog|json|pla]',
    summary: 'part counts in total, per subcircuit and per instance',
    valued: ['format'],
    flags: ['json'],
    run(args, io) {
      const file = oneFile(args, 'count');
      const { design, diagnostics } = load(file, args, io);
      printWarnings(diagnostics, io);
      const c = countParts(design);
      if (args.options.json) {
        io.stdout(JSON.stringify(c, null, 2) + '\n');
        return 0;
      }
      io.stdout(`${file}: ${partsLine(c)}\n`);
      for (const [name, s] of Object.entries(c.bySubcircuit)) {
        io.stdout(`  ${name} × ${s.instances}: each ${partsLine(s.total)}\n`);
      }
      return 0;
    },
  },
  {
    name: 'export',
    aliases: ['convert'],
    usage: 'export FILE --to spice|verilog|json|pla [--out OUT] [--format spice|verilog|json|pla]',
    summary: 'write the design in another format (to OUT, or to standard output)',
    valued: ['to', 'out', 'format'],
    run(args, io) {
      const file = oneFile(args, 'export');
      const to = formatOption(args, 'to');
      if (!to) throw new UsageError('export needs --to spice|verilog|json|pla');
      const { design, diagnostics } = load(file, args, io);
      printWarnings(diagnostics, io);
      const text = writeDesign(design, to);
      const out = args.options.out;
      if (typeof out === 'string') {
        io.writeFile(out, text);
        io.stdout(`${file} → ${out} (${to})\n`);
      } else io.stdout(text);
      return 0;
    },
  },
  {
    name: 'scan',
    usage: 'scan FILE [--assume EXPR]... [--rules id,id] [--clock-period 1us] [--family rtl|dtl|cmos|nmos] [--json] [--format …]',
    summary: 'find transistor-saving rewrites; each with its proof, margins, savings and verdict',
    valued: ['rules', 'clock-period', 'family', 'format'],
    repeatable: ['assume'],
    flags: ['json'],
    async run(args, io) {
      const run = await runScan(args, io, 'scan');
      io.stdout(args.options.json ? JSON.stringify(scanJson(run), null, 2) + '\n' : scanText(run));
      return 0;
    },
  },
  {
    name: 'apply',
    usage: 'apply FILE [--assume EXPR]... (--finding ID)... | --proposals id,id --out OUT [--force] [--rules …] [--clock-period …] [--family …]',
    summary: 'write the design with the chosen findings applied (format from OUT: .cir/.sp SPICE, .v Verilog, .json)',
    valued: ['proposals', 'out', 'rules', 'clock-period', 'family', 'format'],
    repeatable: ['assume', 'finding'],
    flags: ['force'],
    async run(args, io) {
      const out = args.options.out;
      if (typeof out !== 'string') throw new UsageError('apply needs --out OUT');
      const to = formatFromName(out);
      if (!to || to === 'pla') throw new UsageError('--out must end in .cir, .sp, .v or .json');
      const ids = [...(args.lists.finding ?? []), ...(typeof args.options.proposals === 'string' ? args.options.proposals.split(',') : [])].map((x) => x.trim()).filter(Boolean);
      if (ids.length === 0) throw new UsageError('apply needs --finding ID (or --proposals id,id)');
      const run = await runScan(args, io, 'apply');
      const byId = new Map(run.result.findings.flatMap((f) => f.proposals.map((p) => [p.proposal.id, p] as const)));
      const missing = ids.filter((id) => !byId.has(id));
      if (missing.length) {
        throw InputError.at('apply.unknown-finding', `no finding ${missing.join(', ')} in this scan (ids: ${[...byId.keys()].slice(0, 12).join(', ') || 'none'}); scan with the same file and --assume options`);
      }
      const chosen = ids.map((id) => byId.get(id)!);
      const unsafe = chosen.filter((p) => p.verdict !== 'ready');
      if (unsafe.length && !args.options.force) {
        throw InputError.at('apply.not-ready', unsafe.map((p) => `${p.proposal.id} is ${p.verdict}`).join('; ') + ' — only ready findings are applied (--force applies them anyway)');
      }
      const after = applyProposals(run.flat, chosen.map((p) => p.proposal));
      const text = writeDesign(flatToDesign(after, to), to);
      io.writeFile(out, text);
      const saved = chosen.reduce((a, p) => ({ t: a.t + p.savings.transistors, r: a.r + p.savings.resistors, d: a.d + p.savings.diodes }), { t: 0, r: 0, d: 0 });
      io.stdout(`${run.file} → ${out} (${to}): applied ${chosen.map((p) => p.proposal.id).join(', ')}; saves ${saved.t} transistors, ${saved.r} resistors, ${saved.d} diodes\n`);
      const relies = [...new Set(chosen.flatMap((p) => p.proposal.assumptions))];
      if (relies.length) io.stdout(`valid only while ${relies.map((id) => `${id} (${run.assumptions.find((a) => a.id === id)?.text})`).join(', ')} hold\n`);
      io.stdout('check the rewritten board against the parts\' data sheets and simulate it before building.\n');
      return 0;
    },
  },
];
export function parseArgs(argv: string[], cmd: Command): ParsedArgs {
  const positional: string[] = [];
  const options: ParsedArgs['options'] = {};
  const lists: ParsedArgs['lists'] = {};
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith('--') || a === '--') {
      positional.push(a);
      continue;
    }
    const [name, inline] = a.slice(2).split(/=(.*)/s, 2);
    if (cmd.repeatable?.includes(name)) {
      const v = inline ?? argv[++i];
      if (v === undefined) throw new UsageError(`--${name} needs a value`);
      (lists[name] ??= []).push(v);
    } else if (cmd.valued?.includes(name)) {
      const v = inline ?? argv[++i];
      if (v === undefined) throw new UsageError(`--${name} needs a value`);
      options[name] = v;
    } else if (cmd.flags?.includes(name)) options[name] = true;
    else throw new UsageError(`unknown option --${name} for ${cmd.name}`);
  }
  return { positional, options, lists };
}

function help(): string {
  return ['usage: trimwire <command> …', ...COMMANDS.map((c) => `  ${c.usage}\n      ${c.summary}`)].join('\n') + '\n';
}

/** Sync commands return the exit code directly; scan and apply return a promise of it. */
export function runCli(argv: string[], io: CliIo): number | Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === 'help' || name === '--help' || name === '-h') {
    (name ? io.stdout : io.stderr)(help());
    return name ? 0 : 1;
  }
  const cmd = COMMANDS.find((c) => c.name === name || c.aliases?.includes(name));
  if (!cmd) {
    io.stderr(`trimwire: unknown command ${name}\n${help()}`);
    return 1;
  }
  const fail = (e: unknown): number => {
    if (e instanceof UsageError) {
      io.stderr(`trimwire ${cmd.name}: ${e.message}\nusage: trimwire ${cmd.usage}\n`);
      return 1;
    }
    if (e instanceof InputError) {
      for (const d of e.diagnostics) io.stderr(formatDiagnostic(d) + '\n');
      return 2;
    }
    io.stderr(`trimwire: ${e instanceof Error ? e.message : String(e)}\n`);
    return 3;
  };
  try {
    const code = cmd.run(parseArgs(rest, cmd), io);
    return typeof code === 'number' ? code : code.catch(fail);
  } catch (e) {
    return fail(e);
  }
}

export const nodeIo: CliIo = {
  readFile: (p) => readFileSync(p),
  writeFile(p, text) {
    const tmp = `${p}.tmp-${process.pid}`;
    try {
      writeFileSync(tmp, text);
      renameSync(tmp, p);
    } catch (e) {
      try {
        unlinkSync(tmp);
      } catch {
        // Nothing was left behind.
      }
      throw e;
    }
  },
  stdout: (t) => process.stdout.write(t),
  stderr: (t) => process.stderr.write(t),
};

if (require.main === module) {
  void Promise.resolve(runCli(process.argv.slice(2), nodeIo)).then((code) => {
    process.exitCode = code;
  });
}
