// Element cards of a deck (R C D Q M V I X) turned into devices and instances of the current cell,
// with the node-count, model and value checks a simulator would make, each located at its token.
import type { Diagnostic } from '../../errors';
import type { Cell, Device, DeviceKind, Model, ParamValue, SourceLoc } from '../../netlist/ir';
import type { Card, Token } from './lines';
import { NetUse } from '../../netlist/net-use';
import { NumberingRecorder } from '../../netlist/read-numbering';
import { Repeats } from '../../netlist/name-table';
import { netName, numericValue, upper, valueOrText } from './values';
import { empty } from '../../netlist/empty';

/** What the reader gathers about one cell while reading its elements, for validation and flatten. */
export interface CellReading {
  /**
   * The cell's nets, each name kept once (a large deck names the same nets on millions of cards:
   * one shared string per net keeps the design small and lets the rest die young), with how many
   * terminals touch each: validation reads these counts.
   */
  use: NetUse;
  /** The net numbers of the cell's terminals, element by element, for flatten (read-numbering.ts). */
  numbering: NumberingRecorder;
  /**
   * The names of the cell's devices and of its instances, each added as its element is kept
   * (while the name is fresh in memory), for finding repeats once the deck is read.
   */
  deviceNames: Repeats;
  instanceNames: Repeats;
}

export interface ElementContext {
  models: Record<string, Model>;
  params: Record<string, number>;
  report: (severity: Diagnostic['severity'], code: string, message: string, loc?: SourceLoc) => void;
  at: (t: { line: number; col: number }) => SourceLoc;
  /** What has been gathered about each cell so far, and the cell the last card was read into. */
  cells: Map<Cell, CellReading>;
  cell?: Cell;
  reading?: CellReading;
  /** Net indices the card being read has named so far; counted once its element is kept. */
  pending: number[];
  /** The last model token looked up and its model: consecutive cards mostly name the same one. */
  lastModel?: { text: string; model: Model | undefined };
}

/** The model a token names (case-insensitive), undefined when there is none. */
function modelOf(t: Token | undefined, ctx: ElementContext): Model | undefined {
  if (t === undefined) return undefined;
  const last = ctx.lastModel;
  if (last !== undefined && last.text === t.text) return last.model;
  const model = ctx.models[upper(t.text)];
  ctx.lastModel = { text: t.text, model };
  return model;
}

/** The net a node token names (netName's rules), as the one shared string for that net in its cell. */
function net(t: Token, ctx: ElementContext): string {
  const n = netName(t.text);
  const use = ctx.reading!.use;
  const i = use.add(n);
  ctx.pending.push(i);
  return use.names[i];
}

/**
 * Counts the nets the current card named, records their numbers and the element's name: called
 * just before the element joins the cell's devices (or, with `instance`, its instances).
 */
function keep(ctx: ElementContext, name: string, instance = false): void {
  const r = ctx.reading!;
  const counts = r.use.counts;
  for (const i of ctx.pending) counts[i]++;
  if (instance) {
    r.instanceNames.add(name);
    r.numbering.instance(ctx.pending);
  } else {
    r.deviceNames.add(name);
    r.numbering.device(ctx.pending);
  }
  empty(ctx.pending);
}

const WAVEFORMS = new Set(['PULSE', 'PWL', 'SIN', 'EXP', 'SFFM', 'AM', 'TRNOISE', 'TRRANDOM']);

const ELEMENT_NAMES: Record<string, string> = {
  L: 'inductors',
  K: 'coupled inductors',
  B: 'behavioural sources',
  E: 'controlled sources',
  F: 'controlled sources',
  G: 'controlled sources',
  H: 'controlled sources',
  J: 'JFETs',
  Z: 'MESFETs',
  S: 'switches',
  W: 'switches',
  T: 'transmission lines',
  O: 'transmission lines',
  U: 'transmission lines',
  Y: 'transmission lines',
  A: 'code models',
  N: 'device models',
  P: 'coupled lines',
};

interface Args {
  positional: Token[];
  keyed: { key: Token; value: Token }[];
  ok: boolean;
}

/**
 * The one Args splitArgs fills, card after card: like the card and its tokens (lines.ts) it lives
 * only while its card is read, and a large deck has millions of cards.
 */
const ARGS: Args = { positional: [], keyed: [], ok: true };

/**
 * Splits the tokens after the element name into positional tokens and NAME=value pairs. The
 * result and its lists are reused by the next call: read them before the next card.
 */
function splitArgs(tokens: Token[], ctx: ElementContext): Args {
  const args = ARGS;
  const { positional, keyed } = args;
  empty(positional);
  empty(keyed);
  args.ok = false;
  for (let i = 1; i < tokens.length; i++) {
    const t = tokens[i];
    if (tokens[i + 1]?.text === '=') {
      const value = tokens[i + 2];
      if (!value || value.text === '=' || value.text === '(' || value.text === ')') {
        ctx.report('error', 'spice.param-syntax', `${t.text}= needs a value`, ctx.at(t));
        return args;
      }
      keyed.push({ key: t, value });
      i += 2;
      continue;
    }
    if (t.text === '=' || t.text === '(' || t.text === ')') {
      ctx.report('error', 'spice.syntax', `unexpected '${t.text}'`, ctx.at(t));
      return args;
    }
    if (keyed.length > 0) {
      ctx.report('error', 'spice.syntax', `unexpected '${t.text}' after NAME=value parameters`, ctx.at(t));
      return args;
    }
    positional.push(t);
  }
  args.ok = true;
  return args;
}

/**
 * The parameters of every device written without any: one shared, frozen object (a large deck
 * has millions of such devices), so nothing downstream can change them for all at once.
 */
const NO_PARAMS = Object.freeze({}) as Record<string, ParamValue>;

function keyedParams(args: Args, ctx: ElementContext): Record<string, ParamValue> {
  const p: Record<string, ParamValue> = {};
  for (const { key, value } of args.keyed) p[key.text.toUpperCase()] = valueOrText(value.text, ctx.params);
  return p;
}

function value(t: Token, ctx: ElementContext, what: string): number | undefined {
  const v = numericValue(t.text, ctx.params);
  if (v === undefined) ctx.report('error', 'spice.bad-number', `${what}: '${t.text}' is not a number or a known .param`, ctx.at(t));
  return v;
}

export function readElement(card: Card, cell: Cell, ctx: ElementContext): void {
  if (ctx.cell !== cell) {
    let reading = ctx.cells.get(cell);
    if (reading === undefined) {
      reading = { use: new NetUse(cell.ports), numbering: new NumberingRecorder(), deviceNames: new Repeats(), instanceNames: new Repeats() };
      ctx.cells.set(cell, reading);
    }
    ctx.cell = cell;
    ctx.reading = reading;
  }
  empty(ctx.pending);
  const first = card.tokens[0];
  const name = upper(first.text);
  const letter = name[0];
  const loc = ctx.at(first);
  switch (letter) {
    case 'R':
    case 'C':
      return passive(card, cell, ctx, name, letter === 'R' ? 'resistor' : 'capacitor', loc);
    case 'D':
    case 'Q':
    case 'M':
      return semiconductor(card, cell, ctx, name, letter, loc);
    case 'V':
    case 'I':
      return source(card, cell, ctx, name, letter === 'V' ? 'vsource' : 'isource', loc);
    case 'X':
      return instance(card, cell, ctx, name, loc);
    default: {
      const what = ELEMENT_NAMES[letter];
      ctx.report(
        'error',
        'spice.unsupported-element',
        what ? `${what} (${name}) are not supported; elements R C D Q M V I X are` : `unknown element ${name}: element names start with R C D Q M V I or X`,
        loc,
      );
    }
  }
}

function passive(card: Card, cell: Cell, ctx: ElementContext, name: string, kind: DeviceKind, loc: SourceLoc): void {
  const args = splitArgs(card.tokens, ctx);
  if (!args.ok) return;
  const p = args.positional;
  if (p.length < 2) {
    ctx.report('error', 'spice.node-count', `${name} needs 2 nodes, found ${p.length}`, loc);
    return;
  }
  const params = args.keyed.length > 0 ? keyedParams(args, ctx) : NO_PARAMS;
  const key = kind === 'resistor' ? 'R' : 'C';
  let v: number | undefined;
  if (p.length >= 3) {
    v = value(p[2], ctx, `${name} value`);
    if (v === undefined) return;
    if (p.length > 3) {
      ctx.report('error', 'spice.syntax', `unexpected '${p[3].text}' after the value of ${name}`, ctx.at(p[3]));
      return;
    }
  } else if (typeof params[key] === 'number') {
    v = params[key] as number;
    delete params[key];
  } else {
    ctx.report('error', 'spice.missing-value', `${name} needs a value`, loc);
    return;
  }
  const terminals = [net(p[0], ctx), net(p[1], ctx)];
  keep(ctx, name);
  cell.devices.push({ name, kind, terminals, value: v, params, loc });
}

const SEMI = {
  D: { nodes: [2], types: ['d'], what: 'a diode (D) model' },
  Q: { nodes: [3, 4], types: ['npn', 'pnp'], what: 'an npn or pnp model' },
  M: { nodes: [4], types: ['nmos', 'pmos'], what: 'an nmos or pmos model' },
} as const;

function semiconductor(card: Card, cell: Cell, ctx: ElementContext, name: string, letter: 'D' | 'Q' | 'M', loc: SourceLoc): void {
  const args = splitArgs(card.tokens, ctx);
  if (!args.ok) return;
  const spec = SEMI[letter];
  const p = args.positional;
  let nodes = -1;
  for (const n of spec.nodes) if (modelOf(p[n], ctx) !== undefined) nodes = n;
  if (nodes < 0) {
    const counts = spec.nodes.join(' or ');
    const min = spec.nodes[0];
    if (p.length <= min) {
      // Too few tokens: the last one written is taken as the model name.
      ctx.report('error', 'spice.node-count', `${name} needs ${counts} nodes, found ${Math.max(0, p.length - 1)}`, loc);
    } else {
      const candidate = spec.nodes
        .map((n) => p[n])
        .filter((t): t is Token => t !== undefined && numericValue(t.text, ctx.params) === undefined)
        .pop() ?? p[min];
      ctx.report('error', 'spice.unknown-model', `unknown model ${candidate.text.toUpperCase()} (used by ${name})`, ctx.at(candidate));
    }
    return;
  }
  const modelTok = p[nodes];
  const model = modelOf(modelTok, ctx)!;
  if (!(spec.types as readonly string[]).includes(model.type)) {
    ctx.report('error', 'spice.model-type', `${name} needs ${spec.what}; ${model.name} is a ${model.type} model`, ctx.at(modelTok));
    return;
  }
  const params = args.keyed.length > 0 || p.length > nodes + 1 ? keyedParams(args, ctx) : NO_PARAMS;
  for (let k = nodes + 1; k < p.length; k++) {
    const t = p[k];
    const upper = t.text.toUpperCase();
    if (upper === 'OFF') params.OFF = 1;
    else if (letter !== 'M' && params.AREA === undefined && numericValue(t.text, ctx.params) !== undefined) params.AREA = numericValue(t.text, ctx.params)!;
    else {
      ctx.report('error', 'spice.syntax', `unexpected '${t.text}' after the model of ${name}`, ctx.at(t));
      return;
    }
  }
  const kind: DeviceKind = letter === 'D' ? 'diode' : (model.type as DeviceKind);
  // literals, not new Array(n): packed lists, one allocation site the engine can keep long-lived
  const terminals = nodes === 3 ? [net(p[0], ctx), net(p[1], ctx), net(p[2], ctx)] : nodes === 4 ? [net(p[0], ctx), net(p[1], ctx), net(p[2], ctx), net(p[3], ctx)] : [net(p[0], ctx), net(p[1], ctx)];
  const device: Device = { name, kind, terminals, model: model.name, params, loc };
  keep(ctx, name);
  cell.devices.push(device);
}

function source(card: Card, cell: Cell, ctx: ElementContext, name: string, kind: 'vsource' | 'isource', loc: SourceLoc): void {
  const t = card.tokens;
  if (t.length < 3 || t[1].text === '(' || t[2].text === '(') {
    ctx.report('error', 'spice.node-count', `${name} needs 2 nodes, found ${Math.max(0, Math.min(t.length, 3) - 1)}`, loc);
    return;
  }
  const terminals = [net(t[1], ctx), net(t[2], ctx)];
  const params: Record<string, ParamValue> = {};
  let dc: number | undefined;
  let waveform: string | undefined;
  let i = 3;
  while (i < t.length) {
    const word = t[i].text.toUpperCase();
    if (word === 'DC') {
      if (!t[i + 1]) {
        ctx.report('error', 'spice.missing-value', `${name}: DC needs a value`, ctx.at(t[i]));
        return;
      }
      dc = value(t[i + 1], ctx, `${name} DC value`);
      if (dc === undefined) return;
      i += 2;
    } else if (word === 'AC') {
      const parts: string[] = [];
      i++;
      while (i < t.length && numericValue(t[i].text, ctx.params) !== undefined && parts.length < 2) parts.push(t[i++].text);
      params.AC = parts.join(' ') || '1';
    } else if (WAVEFORMS.has(word)) {
      const start = t[i];
      i++;
      const args: string[] = [];
      if (t[i]?.text === '(') {
        i++;
        while (i < t.length && t[i].text !== ')') args.push(t[i++].text);
        if (t[i]?.text !== ')') {
          ctx.report('error', 'spice.syntax', `${word}( has no closing )`, ctx.at(start));
          return;
        }
        i++;
      } else {
        while (i < t.length && !WAVEFORMS.has(t[i].text.toUpperCase()) && !['DC', 'AC'].includes(t[i].text.toUpperCase())) args.push(t[i++].text);
      }
      if (waveform !== undefined) {
        ctx.report('error', 'spice.syntax', `${name} has two waveforms`, ctx.at(start));
        return;
      }
      waveform = `${word}(${args.join(' ')})`;
    } else if (i === 3 && numericValue(t[i].text, ctx.params) !== undefined) {
      dc = numericValue(t[i].text, ctx.params);
      i++;
    } else {
      ctx.report(
        'error',
        'spice.source-spec',
        `${name}: expected DC value, AC, or a waveform (${[...WAVEFORMS].join(' ')}), found '${t[i].text}'`,
        ctx.at(t[i]),
      );
      return;
    }
  }
  const device: Device = { name, kind, terminals, params, loc };
  if (dc !== undefined) device.value = dc;
  if (waveform !== undefined) device.waveform = waveform;
  if (dc === undefined && waveform === undefined && params.AC === undefined) device.value = 0;
  keep(ctx, name);
  cell.devices.push(device);
}

function instance(card: Card, cell: Cell, ctx: ElementContext, name: string, loc: SourceLoc): void {
  const args = splitArgs(card.tokens, ctx);
  if (!args.ok) return;
  if (args.keyed.length > 0) {
    ctx.report('error', 'spice.instance-params', `instance parameters are not supported (${name}); use .param with plain numbers`, ctx.at(args.keyed[0].key));
    return;
  }
  const p = args.positional;
  if (p.length < 1) {
    ctx.report('error', 'spice.instance', `${name} needs nodes and a subcircuit name`, loc);
    return;
  }
  const sub = p[p.length - 1].text.toUpperCase();
  const connections = p.slice(0, -1).map((t) => net(t, ctx));
  keep(ctx, name, true);
  cell.instances.push({ name, cell: sub, connections, params: {}, loc });
}
