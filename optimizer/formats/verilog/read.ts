// Reads structural Verilog (IEEE 1364) into the netlist IR with every problem located; the top
// module is the one no other module instantiates.
import { InputError, type Diagnostic } from '../../errors';
import type { Design } from '../../netlist/ir';
import { DEFAULT_LIMITS } from '../../netlist/limits';
import { validateDesign } from '../../netlist/validate';
import { elaborate, type Problem } from './elaborate';
import { lexVerilog, type LexProblem, type VTok } from './lexer';
import { parseVerilog, type ParseProblem } from './parse';

const MAX_DIAGNOSTICS = 200;

/** `maxUnits` bounds the gates and net bits that bit-blasting may create (2 × the device limit by default). */
export function readVerilog(text: string, file: string, maxUnits = 2 * DEFAULT_LIMITS.maxDevices): { design: Design; diagnostics: Diagnostic[] } {
  const loc = (t: { line: number; col: number }) => ({ file, line: t.line, col: t.col });
  const lexProblems: LexProblem[] = [];
  const toks = lexVerilog(text, lexProblems);
  const parseProblems: ParseProblem[] = [];
  const mods = parseVerilog(toks, parseProblems);
  const problems: Problem[] = [];
  const cells = elaborate(mods, loc, problems, maxUnits);
  const diags: Diagnostic[] = [
    ...lexProblems.map((p) => ({ severity: 'error' as const, code: 'verilog.syntax', message: p.message, loc: loc(p) })),
    ...[...parseProblems, ...problems].map((p) => ({ severity: p.severity, code: 'verilog.syntax', message: p.message, loc: loc(p.tok) })),
  ];
  const instantiated = new Set(mods.flatMap((m) => m.insts.map((i) => i.cell)));
  const tops = mods.filter((m) => !instantiated.has(m.name));
  let top: string;
  if (mods.length === 0) {
    diags.push({ severity: 'error', code: 'verilog.no-module', message: 'no module found', loc: loc(toks[0] as VTok) });
    top = '';
  } else {
    const pick = tops.length > 0 ? tops[tops.length - 1] : mods[mods.length - 1];
    top = pick.name;
    if (tops.length > 1) {
      diags.push({ severity: 'warning', code: 'verilog.several-tops', message: `several top-level modules (${tops.map((t) => t.name).join(', ')}); using ${top}`, loc: loc(pick.tok) });
    }
  }
  const design: Design = { title: top || file, format: 'verilog', top, cells, models: {}, globals: [], params: {}, extraCards: [] };
  if (top && Object.hasOwn(cells, top)) diags.push(...validateDesign(design, { cellNoun: 'module' }).filter((d) => d.code !== 'netlist.unknown-cell'));
  diags.sort((a, b) => (a.loc?.line ?? 0) - (b.loc?.line ?? 0) || (a.loc?.col ?? 0) - (b.loc?.col ?? 0));
  const shown = diags.slice(0, MAX_DIAGNOSTICS);
  if (shown.some((d) => d.severity === 'error')) throw new InputError(shown);
  return { design, diagnostics: shown };
}
