// Margin checks of a driver or line made to carry more loads (a shared driver, a merged driver,
// a bypassed inverter pair): fan-out; for a pulled-up bipolar output, the loaded high level and
// load base current of resistor-fed bases, and the sink current and forced β its own transistor
// needs for diode inputs it must pull low (optimizer/margins formulas, worst corners).
import type { LogicNode } from '../../extract/types';
import type { MapFamily } from '../../logic/family-parts';
import { forcedBeta, loadBaseCurrent, loadedHighLevel, sinkCurrent } from '../../margins/bipolar';
import { maxOf, minOf, type MarginResult } from '../../margins/corners';
import { betaMinOf, type MarginSettings } from '../../margins/defaults';
import { fanOut } from '../../margins/line';
import type { FlatNetlist } from '../../netlist/ir';
import { deepFreeze } from '../freeze';
import { equivalentBaseResistor, type DriverLoads, type NetIndex } from './net-index';

/** β_min of a transistor from its model (BF derated) or the family default. */
export function betaMinOfDevice(nl: FlatNetlist, device: number, s: MarginSettings): number {
  const m = nl.devices[device].model;
  return betaMinOf(m ? nl.models[m.toLowerCase()] : undefined, s).beta;
}

/**
 * Base resistor and drive level of a bipolar driver's (first) switch: a resistor from a control
 * net driven to the supply, or a DTL diode node pull-up less its level-shift drops.
 */
export function baseDriveOf(nl: FlatNetlist, node: LogicNode, s: MarginSettings): { ohms: number; volts: number; transistor: number } | undefined {
  const b = node.groups[0]?.bases[0];
  const vcc = node.pullUp?.railVolts;
  if (!b || vcc === undefined) return undefined;
  if (b.kind === 'diode-and' && b.diodePullUp?.ohms !== undefined) {
    return { ohms: b.diodePullUp.ohms, volts: vcc - b.levelShiftDiodes.length * s.vDiode, transistor: b.transistor };
  }
  const r = b.baseResistors.map((x) => x.ohms).filter((x): x is number => x !== undefined);
  if (r.length === 0) return undefined;
  return { ohms: maxOf(r), volts: vcc, transistor: b.transistor };
}

export function sharedDriverMargins(nl: FlatNetlist, driver: LogicNode, loads: DriverLoads, s: MarginSettings): MarginResult[] {
  const family: MapFamily = driver.family;
  const out: MarginResult[] = [fanOut({ loads: loads.total, family }, s)];
  const rc = driver.pullUp?.kind === 'resistor' ? driver.pullUp.ohms : undefined;
  const vcc = driver.pullUp?.railVolts;
  if (rc === undefined || vcc === undefined) return out;
  if (loads.resistorBases.length) {
    const rb = equivalentBaseResistor(loads.resistorBases);
    out.push(loadedHighLevel({ vcc, rc, rb, loads: loads.resistorBases.length, receiver: 'rtl' }, s));
    const pulled = loads.resistorBases.filter((l) => l.collectorPullUp !== undefined);
    if (pulled.length) {
      const loadPullUp = minOf(pulled.map((l) => l.collectorPullUp!));
      const betaMin = minOf(pulled.map((l) => betaMinOfDevice(nl, l.transistor, s)));
      out.push(loadBaseCurrent({ vcc, rc, rb, loads: loads.resistorBases.length, loadPullUp, betaMin }, s));
    }
  }
  if (loads.diodeInputs.length) {
    const pullUps = [rc, ...loads.diodeInputs.map((d) => d.pullUpOhms)];
    out.push(sinkCurrent({ vcc, pullUps }, s));
    const drive = baseDriveOf(nl, driver, s);
    if (drive) {
      out.push(forcedBeta({ vcc, pullUps, baseResistor: drive.ohms, driveVolts: drive.volts, betaMin: betaMinOfDevice(nl, drive.transistor, s) }, s));
    }
  }
  return out;
}

/**
 * Everything sharedDriverMargins reads of one driver and its loads, as text: two members with the
 * same signature give the same margins in the same place of a shared driver's load list, so a
 * part's margins can be keyed on its members' signatures (and identical members found). Numbers
 * are written as JavaScript prints them, so NaN, Infinity and absent values stay distinct.
 * `betaMemo` keeps β_min per model name across calls (a design has a few models, many devices).
 */
export function driverSignature(
  nl: FlatNetlist,
  driver: LogicNode,
  loads: DriverLoads,
  s: MarginSettings,
  betaMemo: Map<string | undefined, number> = new Map(),
): string {
  const beta = (device: number): number => {
    const model = nl.devices[device].model;
    let b = betaMemo.get(model);
    if (b === undefined) betaMemo.set(model, (b = betaMinOfDevice(nl, device, s)));
    return b;
  };
  const drive = baseDriveOf(nl, driver, s);
  // pieces joined once: the result is a flat string, which callers use as a map key (a string
  // grown by += is a chain of pieces that every look-up has to walk)
  const text: string[] = [`${driver.family}|${driver.pullUp?.kind}|${driver.pullUp?.ohms}|${driver.pullUp?.railVolts}|`];
  text.push(drive ? `${drive.ohms},${drive.volts},${beta(drive.transistor)}` : '-');
  text.push(`|${loads.total}|${loads.direct}|`);
  for (const l of loads.resistorBases) text.push(`${l.ohms},${l.collectorPullUp},${beta(l.transistor)};`);
  text.push('|');
  for (const d of loads.diodeInputs) text.push(`${d.pullUpOhms};`);
  return text.join('');
}

/** One load on a line: a base resistor (RTL) with what that base must saturate, or a plain input. */
export interface LineLoad {
  device: number;
  rb?: number;
  /** Smallest collector pull-up the loaded transistor must saturate, ohms. */
  loadPullUp?: number;
  betaMin?: number;
}

/**
 * Loads of a net as fan-out counts them (one per reading node), with base-resistor detail: the
 * terminals on the net, less the net's own driving node's devices, sources and `except`. Walks the
 * index's terminal table directly (this runs for every line a rule checks).
 */
export function lineLoads(idx: NetIndex, net: number, s: MarginSettings, except?: Set<number>): LineLoad[] {
  const out: LineLoad[] = [];
  const nl = idx.nl as FlatNetlist;
  const ownList = idx.nodeOfNet(net)?.devices ?? [];
  // a node owns a few devices: a linear look-up beats building a set per line
  const own = ownList.length > 16 ? new Set(ownList) : undefined;
  let seenOwner: Set<number> | undefined;
  const { from, to } = idx.termRange(net);
  for (let i = from; i < to; i++) {
    const device = idx.termDevice(i);
    if (own ? own.has(device) : ownList.includes(device)) continue;
    const dev = nl.devices[device];
    if (dev.kind === 'vsource' || dev.kind === 'isource') continue;
    if (except?.has(device)) continue;
    const owner = idx.ownerOf[device];
    if (owner >= 0) {
      const node = idx.view.nodes[owner];
      const base = dev.kind === 'resistor' ? baseFedBy(node, device) : undefined;
      if (base) {
        let loadPullUp: number | undefined;
        for (const u of node.pullUps) if (u.ohms) loadPullUp = loadPullUp === undefined ? u.ohms : Math.min(loadPullUp, u.ohms);
        out.push({ device, rb: dev.value, loadPullUp, betaMin: betaMinOfDevice(nl, base.transistor, s) });
        continue;
      }
      if (seenOwner?.has(owner)) continue;
      (seenOwner ??= new Set()).add(owner);
    }
    out.push({ device });
  }
  return out;
}

/** The base network a resistor feeds, in a node's groups (first match, as the groups list them). */
function baseFedBy(node: LogicNode, resistor: number): LogicNode['groups'][number]['bases'][number] | undefined {
  for (const g of node.groups) for (const b of g.bases) for (const r of b.baseResistors) if (r.device === resistor) return b;
  return undefined;
}

/**
 * Settings a scan hands to rules: a deep-frozen copy, recorded so that margin results computed
 * under it can be remembered by their inputs (frozen settings cannot change under the memo).
 */
const sealed = new WeakSet<MarginSettings>();
const lineMemo = new WeakMap<MarginSettings, Map<string, MarginResult[]>>();
/** Bound on remembered lines per settings object (a design has a few kinds of line). */
const LINE_MEMO_MAX = 4096;

export function sealSettings(s: MarginSettings): MarginSettings {
  if (sealed.has(s)) return s;
  const copy = deepFreeze(structuredClone(s));
  sealed.add(copy);
  return copy;
}

const num = (x: number | undefined): string => (x === undefined ? 'u' : Object.is(x, -0) ? '-0' : String(x));

/**
 * Everything lineMargins reads of a driver and its loads, as text: the family, the driver's
 * resistor pull-up and rail, the load count, and the base loads' count and worst figures.
 */
function lineKey(driver: LogicNode | undefined, loads: LineLoad[], family: MapFamily, s: MarginSettings): string {
  if (!driver) return [family, loads.length, '-'].join('|');
  const rc = driver.pullUp?.kind === 'resistor' ? driver.pullUp.ohms : undefined;
  let bases = 0;
  let rb = Infinity;
  let withLoad = 0;
  let loadPullUp = Infinity;
  let beta = Infinity;
  for (const l of loads) {
    if (l.rb === undefined) continue;
    bases++;
    rb = Math.min(rb, l.rb);
    if (l.loadPullUp !== undefined) {
      withLoad++;
      loadPullUp = Math.min(loadPullUp, l.loadPullUp);
      beta = Math.min(beta, l.betaMin ?? s.defaultBetaMin);
    }
  }
  // joined (a flat string) rather than a template: it is a map key looked up once per line
  return [family, loads.length, num(rc), num(driver.pullUp?.railVolts), bases, num(rb), withLoad, num(loadPullUp), num(beta)].join('|');
}

function copyMargin(m: MarginResult): MarginResult {
  return { ...m, corner: { ...m.corner }, ...(m.inputs ? { inputs: { ...m.inputs } } : {}) } as MarginResult;
}

/**
 * Fan-out, and loaded high level / load base current where the line is an RTL resistor pull-up.
 * Under sealed settings the results are remembered by lineKey (a scan checks the same kind of
 * line in every slice) and each call gets its own copies.
 */
export function lineMargins(driver: LogicNode | undefined, loads: LineLoad[], family: MapFamily, s: MarginSettings): MarginResult[] {
  if (!sealed.has(s)) return computeLineMargins(driver, loads, family, s);
  let memo = lineMemo.get(s);
  if (!memo) lineMemo.set(s, (memo = new Map()));
  const key = lineKey(driver, loads, family, s);
  let hit = memo.get(key);
  if (!hit) {
    hit = computeLineMargins(driver, loads, family, s);
    if (memo.size >= LINE_MEMO_MAX) memo.clear();
    memo.set(key, hit);
  }
  return hit.map(copyMargin);
}

function computeLineMargins(driver: LogicNode | undefined, loads: LineLoad[], family: MapFamily, s: MarginSettings): MarginResult[] {
  const out: MarginResult[] = [fanOut({ loads: loads.length, family }, s)];
  if (!driver) {
    out[0] = { ...out[0], note: `${out[0].note}; the line is driven from outside this design — check its driver's data sheet` };
    return out;
  }
  const rc = driver.pullUp?.kind === 'resistor' ? driver.pullUp.ohms : undefined;
  const bases = loads.filter((l) => l.rb !== undefined);
  if (rc === undefined || bases.length === 0 || bases.length !== loads.length) return out;
  const vcc = driver.pullUp!.railVolts;
  const rb = minOf(bases.map((l) => l.rb!));
  out.push(loadedHighLevel({ vcc, rc, rb, loads: bases.length, receiver: family === 'dtl' ? 'dtl' : 'rtl' }, s));
  const withLoad = bases.filter((l) => l.loadPullUp !== undefined);
  if (withLoad.length) {
    out.push(
      loadBaseCurrent(
        {
          vcc,
          rc,
          rb,
          loads: bases.length,
          loadPullUp: minOf(withLoad.map((l) => l.loadPullUp!)),
          betaMin: minOf(withLoad.map((l) => l.betaMin ?? s.defaultBetaMin)),
        },
        s,
      ),
    );
  }
  return out;
}

export const failing = (ms: MarginResult[]): boolean => ms.some((m) => m.status === 'fail');
