// The `trimwire` command line: the one engine file that touches files and the terminal. Commands
// live in one table (name → usage, options, run) so more can be added beside these.
// Exit codes: 0 done (warnings allowed), 1 usage error, 2 input errors, 3 internal error.
import { readFileSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { InputError, formatDiagnostic, type Diagnostic } from './errors';
import { FORMATS, readDesign, writeDesign, type ReadResult } from './formats/index';
import { countParts, type PartCounts } from './netlist/counts';
import { flatten } from './netlist/flatten';
import type { Format } from './netlist/ir';

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
}

export interface Command {
  name: string;
  aliases?: string[];
  usage: string;
  summary: string;
  /** Options taking a value; others are flags. */
  valued?: string[];
  flags?: string[];
  run(args: ParsedArgs, io: CliIo): number;
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

function printWarnings(diags: Diagnostic[], io: CliIo): void {
  for (const d of diags) if (d.severity === 'warning') io.stderr(formatDiagnostic(d) + '\n');
}

function partsLine(c: PartCounts): string {
  return `${c.transistors} transistors, ${c.resistors} resistors, ${c.diodes} diodes, ${c.capacitors} capacitors, ${c.gates} gates`;
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
];

export function parseArgs(argv: string[], cmd: Command): ParsedArgs {
  const positional: string[] = [];
  const options: ParsedArgs['options'] = {};
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith('--') || a === '--') {
      positional.push(a);
      continue;
    }
    const [name, inline] = a.slice(2).split(/=(.*)/s, 2);
    if (cmd.valued?.includes(name)) {
      const v = inline ?? argv[++i];
      if (v === undefined) throw new UsageError(`--${name} needs a value`);
      options[name] = v;
    } else if (cmd.flags?.includes(name)) options[name] = true;
    else throw new UsageError(`unknown option --${name} for ${cmd.name}`);
  }
  return { positional, options };
}

function help(): string {
  return ['usage: trimwire <command> …', ...COMMANDS.map((c) => `  ${c.usage}\n      ${c.summary}`)].join('\n') + '\n';
}

export function runCli(argv: string[], io: CliIo): number {
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
  try {
    return cmd.run(parseArgs(rest, cmd), io);
  } catch (e) {
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
  process.exitCode = runCli(process.argv.slice(2), nodeIo);
}
