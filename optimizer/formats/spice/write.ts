// Writes a Design as a SPICE-style deck that ngspice runs unchanged: models, parameters,
// subcircuits, the top cell's cards at top level, kept analysis cards, `.end`. Names from other
// formats are made legal deck names (right leading letter, no separators, unique ignoring case).
// Gate-level devices have no transistor form in a deck; they are refused with a clear message.
import { own } from '../../netlist/own';
import { InputError, type Diagnostic } from '../../errors';
import { GROUND, type Cell, type Design, type Device, type ParamValue } from '../../netlist/ir';
import { formatSpiceNumber } from './numbers';

const LETTER: Record<Exclude<Device['kind'], 'gate'>, string> = {
  resistor: 'R',
  capacitor: 'C',
  diode: 'D',
  npn: 'Q',
  pnp: 'Q',
  nmos: 'M',
  pmos: 'M',
  vsource: 'V',
  isource: 'I',
};

const MAX_LINE = 200;

/** Maps names to legal, case-insensitively unique deck names (stable per original name). */
class NameMap {
  private readonly byOriginal = new Map<string, string>();
  private readonly used = new Set<string>();
  /** `fixed` pairs (original, deck name) are kept as given, e.g. ground and global nets. */
  constructor(fixed: [string, string][] = []) {
    for (const [o, n] of fixed) {
      this.byOriginal.set(o, n);
      this.used.add(n.toUpperCase());
    }
  }
  get(original: string, prefix = ''): string {
    const known = this.byOriginal.get(original);
    if (known !== undefined) return known;
    let base = original.replace(/[^A-Za-z0-9_.:$#!+\-]/g, '_') || '_';
    if (prefix && base[0].toUpperCase() !== prefix) base = prefix + base;
    let name = base;
    for (let k = 2; this.used.has(name.toUpperCase()); k++) name = `${base}_${k}`;
    this.used.add(name.toUpperCase());
    this.byOriginal.set(original, name);
    return name;
  }
}

function paramText(v: ParamValue): string {
  return typeof v === 'number' ? formatSpiceNumber(v) : v;
}

function keyed(params: Record<string, ParamValue>, skip: string[] = []): string[] {
  const out: string[] = [];
  for (const [k, v] of Object.entries(params)) {
    if (skip.includes(k)) continue;
    out.push(`${k}=${paramText(v)}`);
  }
  return out;
}

/** Joins words into lines no longer than MAX_LINE, continuing with `+`. */
function card(words: string[]): string {
  const lines: string[] = [];
  let cur = '';
  for (const w of words) {
    if (cur && cur.length + 1 + w.length > MAX_LINE) {
      lines.push(cur);
      cur = '+ ' + w;
    } else cur = cur ? cur + ' ' + w : w;
  }
  lines.push(cur);
  return lines.join('\n');
}

export function writeSpice(design: Design): string {
  refuseGates(design);
  const models = new NameMap();
  const cellNames = new NameMap();
  const out: string[] = [(design.title || 'untitled').replace(/[\r\n]+/g, ' ')];
  const globals = design.globals.filter((g) => g !== GROUND);
  const nets = new NameMap([[GROUND, GROUND]]);
  if (globals.length > 0) out.push(card(['.global', ...globals.map((g) => nets.get(g))]));
  const params = Object.entries(design.params);
  if (params.length > 0) out.push(card(['.param', ...params.map(([k, v]) => `${k}=${formatSpiceNumber(v)}`)]));
  for (const m of Object.values(design.models)) {
    const type = m.type.toLowerCase() === 'd' ? 'D' : m.type.toUpperCase();
    out.push(card(['.model', models.get(m.name), type, '(', ...keyed(m.params), ')']));
  }
  for (const cell of Object.values(design.cells)) {
    if (cell.name === design.top) continue;
    const local = new NameMap([[GROUND, GROUND], ...globals.map((g): [string, string] => [g, nets.get(g)])]);
    out.push(card(['.subckt', cellNames.get(cell.name), ...cell.ports.map((p) => local.get(p))]));
    writeBody(cell, out, local, models, cellNames, design);
    out.push(`.ends ${cellNames.get(cell.name)}`);
  }
  const top = own(design.cells, design.top);
  if (!top) throw InputError.at('netlist.no-top', `top cell ${design.top} is not defined`);
  writeBody(top, out, nets, models, cellNames, design);
  for (const c of design.extraCards) out.push(c.text);
  out.push('.end');
  return out.join('\n') + '\n';
}

function writeBody(cell: Cell, out: string[], nets: NameMap, models: NameMap, cellNames: NameMap, design: Design): void {
  const devNames = new NameMap();
  const missing: Diagnostic[] = [];
  for (const d of cell.devices) {
    if (d.kind === 'gate') continue;
    const name = devNames.get(d.name, LETTER[d.kind]);
    const t = d.terminals.map((n) => nets.get(n));
    switch (d.kind) {
      case 'resistor':
      case 'capacitor':
        out.push(card([name, t[0], t[1], formatSpiceNumber(d.value ?? 0), ...keyed(d.params)]));
        break;
      case 'diode':
      case 'npn':
      case 'pnp':
      case 'nmos':
      case 'pmos': {
        const model = d.model === undefined ? undefined : modelByUpper(design).get(d.model.toUpperCase());
        if (model === undefined) {
          missing.push({ severity: 'error', code: 'spice.write-model', message: `${d.name} has no model card; a deck needs one for every transistor and diode`, loc: d.loc });
          break;
        }
        const nodes = (d.kind === 'nmos' || d.kind === 'pmos') && t.length === 3 ? [...t, t[2]] : t;
        const extra: string[] = [];
        if (d.params.AREA !== undefined && d.kind !== 'nmos' && d.kind !== 'pmos') extra.push(paramText(d.params.AREA));
        if (d.params.OFF !== undefined) extra.push('OFF');
        out.push(card([name, ...nodes, models.get(model.name), ...extra, ...keyed(d.params, ['AREA', 'OFF'])]));
        break;
      }
      case 'vsource':
      case 'isource': {
        const spec: string[] = [];
        if (d.value !== undefined) spec.push('DC', formatSpiceNumber(d.value));
        if (d.params.AC !== undefined) spec.push('AC', paramText(d.params.AC));
        if (d.waveform !== undefined) spec.push(d.waveform);
        out.push(card([name, t[0], t[1], ...spec]));
        break;
      }
    }
  }
  if (missing.length > 0) throw new InputError(missing);
  for (const i of cell.instances) {
    out.push(card([devNames.get(i.name, 'X'), ...i.connections.map((n) => nets.get(n)), cellNames.get(i.cell)]));
  }
}

const modelMaps = new WeakMap<Design, Map<string, Design['models'][string]>>();

/** Model names resolve case-insensitively, as in a deck. */
function modelByUpper(design: Design): Map<string, Design['models'][string]> {
  let m = modelMaps.get(design);
  if (!m) {
    m = new Map(Object.values(design.models).map((x) => [x.name.toUpperCase(), x]));
    modelMaps.set(design, m);
  }
  return m;
}

function refuseGates(design: Design): void {
  const gates: string[] = [];
  for (const cell of Object.values(design.cells)) {
    for (const d of cell.devices) if (d.kind === 'gate') gates.push(`${d.name} (${d.op})`);
  }
  if (gates.length === 0) return;
  const shown = gates.slice(0, 5).join(', ') + (gates.length > 5 ? `, and ${gates.length - 5} more` : '');
  throw InputError.at(
    'spice.write-gates',
    `gate-level devices cannot be written as a SPICE deck: ${shown}. A deck holds transistors, resistors, diodes, capacitors and sources; export gate-level designs as Verilog or JSON`,
  );
}
