// Reads a SPICE-style deck into the netlist IR. Every problem is collected with its file:line:col
// and thrown together as one InputError; warnings come back beside the design. Cards the engine
// cannot use but a simulator needs (.tran, .control … .endc) are kept verbatim for writing back.
import { InputError, type Diagnostic } from '../../errors';
import { GROUND, type Cell, type Design, type Model, type SourceLoc } from '../../netlist/ir';
import { validateDesign, type ValidateOptions } from '../../netlist/validate';
import type { Repeats } from '../../netlist/name-table';
import type { NetUse } from '../../netlist/net-use';
import { forEachCard, type Card, type Token, type TokenizeProblem } from './lines';
import { netName, numericValue, valueOrText } from './values';
import { readElement, type ElementContext } from './elements';
import { empty } from '../../netlist/empty';

/** Name of the cell that holds a deck's top-level cards (parentheses cannot appear in deck names). */
export const SPICE_TOP = '(top)';

/** Cards a simulator needs but the engine does not: kept verbatim and written back. */
const KEPT_CARDS = new Set([
  '.tran', '.dc', '.op', '.ac', '.tf', '.noise', '.four', '.sens', '.pz', '.disto',
  '.meas', '.measure', '.print', '.plot', '.probe', '.save', '.option', '.options', '.opt',
  '.ic', '.nodeset', '.temp', '.width',
]);

const NOT_SINGLE_FILE = new Set(['.include', '.inc', '.lib', '.incl']);

const MAX_ERRORS = 200;

export interface ReadResult {
  design: Design;
  diagnostics: Diagnostic[];
}

class TooManyErrors extends Error {}

export function readSpice(text: string, file: string): ReadResult {
  const diags: Diagnostic[] = [];
  let errors = 0;
  const report = (severity: Diagnostic['severity'], code: string, message: string, loc?: SourceLoc) => {
    diags.push({ severity, code, message, loc });
    if (severity === 'error' && ++errors >= MAX_ERRORS) {
      diags.push({ severity: 'error', code: 'spice.too-many-errors', message: `too many errors (${MAX_ERRORS}); stopped reading`, loc });
      throw new TooManyErrors();
    }
  };
  const at = (t: { line: number; col: number }): SourceLoc => ({ file, line: t.line, col: t.col });
  try {
    const { design, netUse, nameHashes } = read(text, file, report, at);
    // Structural checks run even after card errors so one upload reports every problem at once.
    for (const d of validateDesign(design, { cellNoun: 'subcircuit', netUse, nameHashes })) report(d.severity, d.code, d.message, d.loc);
    if (errors > 0) throw new InputError(sortDiagnostics(diags));
    return { design, diagnostics: sortDiagnostics(diags) };
  } catch (e) {
    if (e instanceof TooManyErrors) throw new InputError(diags);
    throw e;
  }
}

function sortDiagnostics(d: Diagnostic[]): Diagnostic[] {
  return [...d].sort((a, b) => (a.loc?.line ?? 0) - (b.loc?.line ?? 0) || (a.loc?.col ?? 0) - (b.loc?.col ?? 0));
}

type Report = (severity: Diagnostic['severity'], code: string, message: string, loc?: SourceLoc) => void;

interface Read {
  design: Design;
  /** What validation would otherwise gather by walking every cell again (ValidateOptions). */
  netUse: NonNullable<ValidateOptions['netUse']>;
  nameHashes: NonNullable<ValidateOptions['nameHashes']>;
}

function read(text: string, file: string, report: Report, at: (t: { line: number; col: number }) => SourceLoc): Read {
  const firstBreak = text.indexOf('\n');
  const title = (firstBreak < 0 ? text : text.slice(0, firstBreak)).replace(/\r$/, '').trim();
  if (text.trim() === '') report('error', 'spice.empty', 'the deck is empty (its first line is the title)', { file, line: 1, col: 1 });
  const problems: TokenizeProblem[] = [];
  const flushProblems = () => {
    for (const p of problems) report('error', 'spice.syntax', p.message, { file, line: p.line, col: p.col });
    empty(problems);
  };

  // Pass 1: models and parameters, which elements may use before the card that defines them.
  const models: Record<string, Model> = {};
  const params: Record<string, number> = {};
  const paramLoc = new Map<string, SourceLoc>();
  let ended = false;
  forEachCard(
    text,
    {
      card(card) {
        if (ended) return;
        const kw = card.tokens[0].text.toLowerCase();
        if (kw === '.end') ended = true;
        else if (kw === '.model') readModel(card, models, params, report, at);
        else if (kw === '.param') readParam(card, params, paramLoc, report, at);
      },
      controlBlock() {},
    },
    [],
    (c) => c === '.',
  );

  // Pass 2: everything else, in order, tracking the subcircuit being defined.
  const top: Cell = { name: SPICE_TOP, ports: [], devices: [], instances: [] };
  const cells: Record<string, Cell> = { [SPICE_TOP]: top };
  const globals: string[] = [];
  const extraCards: Design['extraCards'] = [];
  let current = top;
  let ended2 = false;
  let endLine = 0;
  const ctx: ElementContext = { models, params, report, at, cells: new Map(), pending: [] };
  forEachCard(
    text,
    {
      card(card) {
        if (ended2) {
          if (endLine > 0) {
            report('warning', 'spice.after-end', 'text after .end is ignored', at(card));
            endLine = 0;
          }
          return;
        }
        flushProblems();
        const first = card.tokens[0];
        if (first.text[0] !== '.') {
          readElement(card, current, ctx);
          return;
        }
        const kw = first.text.toLowerCase();
        if (kw === '.model' || kw === '.param') return;
        if (kw === '.end') {
          ended2 = true;
          endLine = card.line;
        } else if (kw === '.subckt') {
          if (current !== top) {
            report('error', 'spice.nested-subckt', `nested .subckt definitions are not supported (inside ${current.name})`, at(first));
            return;
          }
          const sub = readSubcktHeader(card, cells, report, at);
          if (sub) current = sub;
        } else if (kw === '.ends') {
          if (current === top) {
            report('error', 'spice.stray-ends', '.ends without a .subckt', at(first));
            return;
          }
          const named = card.tokens[1]?.text.toUpperCase();
          if (named !== undefined && named !== current.name) {
            report('error', 'spice.ends-name', `.ends ${named} closes .subckt ${current.name}`, at(card.tokens[1]));
          }
          current = top;
        } else if (kw === '.global') {
          for (const t of card.tokens.slice(1)) {
            const n = netName(t.text);
            if (n !== GROUND && !globals.includes(n)) globals.push(n);
          }
        } else if (kw === '.title') {
          // The first line is still the title; a later .title is kept for writing back.
          extraCards.push({ text: card.raw, loc: at(first) });
        } else if (NOT_SINGLE_FILE.has(kw)) {
          report('error', 'spice.include', `${kw} is not supported: upload one self-contained deck with the models and subcircuits in it`, at(first));
        } else if (KEPT_CARDS.has(kw)) {
          if (current !== top) report('error', 'spice.card-in-subckt', `${kw} cannot appear inside .subckt ${current.name}`, at(first));
          else extraCards.push({ text: card.raw, loc: at(first) });
        } else if (kw === '.endc') {
          report('error', 'spice.stray-endc', '.endc without a .control', at(first));
        } else {
          report('error', 'spice.unsupported-card', `unsupported card ${kw}`, at(first));
        }
      },
      controlBlock(raw, line, terminated) {
        if (ended2) return;
        if (!terminated) report('error', 'spice.unterminated-control', '.control block has no .endc', { file, line, col: 1 });
        else extraCards.push({ text: raw, loc: { file, line, col: 1 } });
      },
    },
    problems,
  );
  flushProblems();
  if (current !== top) {
    report('error', 'spice.unterminated-subckt', `.subckt ${current.name} has no .ends`, current.loc);
  }
  const netUse = new Map<Cell, NetUse>();
  const nameHashes = new Map<Cell, { devices: Repeats; instances: Repeats }>();
  for (const [cell, r] of ctx.cells) {
    netUse.set(cell, r.use);
    // Devices and instances apart: an instance's name starts with X and a device's never does.
    nameHashes.set(cell, { devices: r.deviceNames, instances: r.instanceNames });
    // The net numbering stays beside the cell for flatten (of the net table, only its names).
    r.numbering.keep(cell, r.use.names);
  }
  return { design: { title, format: 'spice', top: SPICE_TOP, cells, models, globals, params, extraCards }, netUse, nameHashes };
}

function readSubcktHeader(card: Card, cells: Record<string, Cell>, report: Report, at: (t: Token) => SourceLoc): Cell | null {
  const t = card.tokens;
  if (t.length < 2) {
    report('error', 'spice.subckt-name', '.subckt needs a name', at(t[0]));
    return null;
  }
  const name = t[1].text.toUpperCase();
  const ports: string[] = [];
  let ok = true;
  for (const p of t.slice(2)) {
    if (p.text === '=' || p.text.toLowerCase() === 'params:') {
      report('error', 'spice.subckt-params', 'subcircuit parameters are not supported; use .param with plain numbers', at(p));
      ok = false;
      break;
    }
    if (p.text === '(' || p.text === ')') continue;
    const n = netName(p.text);
    if (n === GROUND) {
      report('error', 'spice.ground-port', 'ground (0) cannot be a subcircuit port', at(p));
      ok = false;
    } else if (ports.includes(n)) {
      report('error', 'spice.duplicate-port', `port ${n} is listed twice`, at(p));
      ok = false;
    } else ports.push(n);
  }
  if (cells[name]) {
    report('error', 'spice.duplicate-subckt', `subcircuit ${name} is defined twice (first at line ${cells[name].loc?.line})`, at(t[1]));
  }
  const cell: Cell = { name, ports, devices: [], instances: [], loc: at(t[0]) };
  if (!cells[name] && ok) cells[name] = cell;
  // Still read the body into a detached cell so its errors are reported and .ends matches.
  return cell;
}

function readModel(card: Card, models: Record<string, Model>, params: Record<string, number>, report: Report, at: (t: Token) => SourceLoc): void {
  const t = card.tokens;
  if (t.length < 3) {
    report('error', 'spice.model', '.model needs a name and a type', at(t[0]));
    return;
  }
  const name = t[1].text.toUpperCase();
  const type = t[2].text.toLowerCase();
  const mp: Model['params'] = {};
  const rest = t.slice(3).filter((x) => x.text !== '(' && x.text !== ')');
  for (let i = 0; i < rest.length; i++) {
    const key = rest[i];
    if (rest[i + 1]?.text !== '=' || rest[i + 2] === undefined) {
      report('error', 'spice.model-param', `model parameter must be NAME=value, found '${key.text}'`, at(key));
      return;
    }
    mp[key.text.toUpperCase()] = valueOrText(rest[i + 2].text, params);
    i += 2;
  }
  if (models[name]) {
    report('error', 'spice.duplicate-model', `model ${name} is defined twice (first at line ${models[name].loc?.line})`, at(t[1]));
    return;
  }
  models[name] = { name, type, params: mp, loc: at(t[1]) };
}

function readParam(card: Card, params: Record<string, number>, locs: Map<string, SourceLoc>, report: Report, at: (t: Token) => SourceLoc): void {
  const t = card.tokens;
  if (t.length < 2) report('error', 'spice.param', '.param needs NAME=number', at(t[0]));
  for (let i = 1; i < t.length; i += 3) {
    const name = t[i];
    const value = t[i + 2];
    if (t[i + 1]?.text !== '=' || value === undefined || !/^[A-Za-z_][\w]*$/.test(name.text)) {
      report('error', 'spice.param', `.param needs NAME=number, found '${name.text}'`, at(name));
      return;
    }
    const key = name.text.toUpperCase();
    const v = numericValue(value.text, params);
    if (v === undefined) {
      report('error', 'spice.param-value', `.param ${key}: '${value.text}' is not a plain number`, at(value));
      continue;
    }
    if (locs.has(key)) {
      report('error', 'spice.duplicate-param', `parameter ${key} is defined twice (first at line ${locs.get(key)!.line})`, at(name));
      continue;
    }
    params[key] = v;
    locs.set(key, at(name));
  }
}
