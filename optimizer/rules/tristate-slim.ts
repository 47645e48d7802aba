// tristate-slim: full tri-state output stages sharing a line (both output devices switched off by
// an enable) become open-drain drive — each stage keeps only its pull-down path — with one pull-up
// per line, chosen from the E-series inside the common-practice sizing window and the rise-time
// limit. Valid only while at most one stage drives at a time: the rule proves that from the stated
// assumptions, lists the ones it relies on, and otherwise says so with a counterexample.
import { z } from 'zod';
import { combinationalModel } from '../extract/compose';
import type { LogicNode, SwitchNetwork } from '../extract/types';
import { and, not, or, substitute, support, type Expr } from '../logic/expr';
import type { MapFamily } from '../logic/family-parts';
import { type MarginResult, round, statusAtLeast, statusAtMost } from '../margins/corners';
import { thresholdsFor } from '../margins/defaults';
import { lineCapacitance, RISE_FACTOR, riseTime, staticPower } from '../margins/line';
import type { GateOp } from '../netlist/ir';
import { checkEquivalence } from '../verify/equivalence';
import { networkPaths } from './constant-input';
import { defineRule } from './define-rule';
import { instancesOf, listWords, placeOf } from './support/finding-words';
import { NetIndex } from './support/net-index';
import { emptyEdit, type AddedDevice, type RuleContext } from './types';

const E12 = [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2];
const E24 = [1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1];

export function seriesValues(series: 'E12' | 'E24'): number[] {
  const base = series === 'E12' ? E12 : E24;
  const out: number[] = [];
  for (let decade = 10; decade <= 1e6; decade *= 10) for (const m of base) out.push(Math.round(m * decade * 100) / 100);
  return out;
}

export const formatOhms = (r: number): string => (r >= 1e6 ? `${round(r / 1e6, 3)} MΩ` : r >= 1e3 ? `${round(r / 1e3, 3)} kΩ` : `${round(r, 3)} Ω`);

const OptionsSchema = z.object({
  /** Fewest stages on one line for it to count as a shared line. */
  minDrivers: z.number().int().min(1),
  /** Clock period, s, used when the design or board gives none. */
  clockPeriod: z.number().positive(),
  series: z.enum(['E12', 'E24']),
  /** Driver's guaranteed low level and the current it sinks there (check the data sheet). */
  volMax: z.number().positive(),
  iolMax: z.number().positive(),
  /** Input currents per load, low and high, and off-state leakage per driver, A. */
  iilPerLoad: z.number().min(0),
  iihPerLoad: z.number().min(0),
  leakPerDriver: z.number().min(0),
  /** Line capacitance, F (default: the margin settings' line + per-load figures). */
  lineCapacitance: z.number().positive().optional(),
});
type Options = z.infer<typeof OptionsSchema>;

interface Stage {
  devices: number[];
  hi: Expr;
  lo: Expr;
  /** Devices only on pull-high paths: what open-drain drive no longer needs. */
  pullHighOnly: number[];
  gate?: { device: number; op: GateOp };
}

export const tristateSlim = defineRule({
  id: 'tristate-slim',
  meta: {
    description: 'Tri-state output stages on a shared line: open-drain drive with one pull-up per line, while at most one stage is enabled.',
    messages: {
      slim: '{drivers} tri-state stages drive {bus} ({places}); {relies} keeps at most one driving, so open-drain drive with one {resistor} pull-up does the same job',
      needsOneHot:
        '{drivers} tri-state stages drive {bus} ({places}) and no stated assumption keeps two from driving together: with {cex} the tri-state line reads {before} but an open-drain line would read {after}; state a one-hot assumption over the enables first',
    },
    optionsSchema: OptionsSchema,
    defaultOptions: { minDrivers: 2, clockPeriod: 1e-6, series: 'E24', volMax: 0.4, iolMax: 4e-3, iilPerLoad: 1e-6, iihPerLoad: 1e-6, leakPerDriver: 1e-6 },
  },
  find(ctx, options) {
    const idx = new NetIndex(ctx.netlist, ctx.view);
    for (const node of ctx.view.nodes) {
      if (node.kind !== 'tristate' || !idx.ownsAlone(node)) continue;
      const stages = node.family === 'gate' ? gateStages(ctx, node) : mosStages(ctx, idx, node);
      if (!stages || stages.length < options.minDrivers) continue;
      slim(ctx, idx, node, stages, options);
    }
  },
});

function gateStages(ctx: RuleContext, node: LogicNode): Stage[] | undefined {
  const out: Stage[] = [];
  for (const g of node.groups) {
    const d = g.devices[0];
    const op = ctx.netlist.devices[d].op;
    if (g.devices.length !== 1 || !op || !['bufif0', 'bufif1', 'notif0', 'notif1'].includes(op)) return undefined;
    out.push({ devices: [d], hi: g.pullsHigh, lo: g.pullsLow, pullHighOnly: [d], gate: { device: d, op } });
  }
  return out;
}

/** Stages of a MOS tri-state line: pull-high and pull-low stacks grouped by instance and shared data inputs. */
function mosStages(ctx: RuleContext, idx: NetIndex, node: LogicNode): Stage[] | undefined {
  if (node.groups.length !== 1) return undefined;
  const g = node.groups[0];
  if (!g.pullUp || !g.pullDown) return undefined;
  const nl = ctx.netlist;
  const on = new Map<number, Expr>();
  const collect = (n: SwitchNetwork) => (n.type === 'switch' ? on.set(n.device, n.on) : n.parts.forEach(collect));
  collect(g.pullUp);
  collect(g.pullDown);
  const hiPaths = networkPaths(g.pullUp);
  const loPaths = networkPaths(g.pullDown);
  const all = [...hiPaths, ...loPaths];
  const parent = all.map((_, i) => i);
  const find = (x: number): number => (parent[x] === x ? x : (parent[x] = find(parent[x])));
  const key = (p: number[]) => ({ path: nl.devices[p[0]].path.join('.'), gates: new Set(p.map((d) => nl.devices[d].terminals[1]).filter((n) => !idx.railNets.has(n))) });
  const keys = all.map(key);
  for (let i = 0; i < all.length; i++) {
    for (let j = i + 1; j < all.length; j++) {
      const same = keys[i].path && keys[i].path === keys[j].path;
      const shared = !keys[i].path && !keys[j].path && [...keys[i].gates].some((n) => keys[j].gates.has(n));
      if (same || shared || all[i].some((d) => all[j].includes(d))) parent[find(i)] = find(j);
    }
  }
  const groups = new Map<number, number[]>();
  all.forEach((_, i) => groups.set(find(i), [...(groups.get(find(i)) ?? []), i]));
  const cond = (p: number[]) => and(...p.map((d) => on.get(d)!));
  const stages: Stage[] = [];
  for (const members of groups.values()) {
    const hi = members.filter((i) => i < hiPaths.length).map((i) => all[i]);
    const lo = members.filter((i) => i >= hiPaths.length).map((i) => all[i]);
    if (hi.length === 0 || lo.length === 0) return undefined; // not a full push-pull stage
    const loDevs = new Set(lo.flat());
    stages.push({
      devices: [...new Set(members.flatMap((i) => all[i]))],
      hi: or(...hi.map(cond)),
      lo: or(...lo.map(cond)),
      pullHighOnly: [...new Set(hi.flat())].filter((d) => !loDevs.has(d)),
    });
  }
  return stages;
}

function slim(ctx: RuleContext, idx: NetIndex, node: LogicNode, stages: Stage[], o: Options): void {
  const nl = ctx.netlist;
  // Drive conditions over primary inputs, so "ENB = !EN" made by an inverter is known to the proof.
  const names = new Set<string>();
  for (const s of stages) support(or(s.hi, s.lo), names);
  const model = combinationalModel(ctx.view as never, [...names]);
  const compose = (e: Expr) => substitute(e, (n) => model.outputs[n]);
  const hi = stages.map((s) => compose(s.hi));
  const lo = stages.map((s) => compose(s.lo));
  const enabled = or(...hi, ...lo);
  // Only where some stage drives: an idle tri-state line floats, which no reader may rely on.
  const before = and(enabled, or(...hi));
  const after = and(enabled, ...lo.map((l) => not(l)));
  const verdict = checkEquivalence({ [node.name]: before }, { [node.name]: after }, { assumptions: ctx.assumptions.map((a) => ({ name: a.id, expr: a.expr })) });
  const places = listWords([...new Set(stages.map((s) => placeOf(nl.devices[s.devices[0]].path)))], 3);
  // Edit: pull-high devices go (and enable-complement drivers nothing else reads); one pull-up.
  const removed = new Set(stages.flatMap((s) => (s.gate ? [s.gate.device] : s.pullHighOnly)));
  const highRail = [...removed].flatMap((d) => nl.devices[d].terminals).find((t) => idx.railNets.has(t) && nl.rails.find((r) => r.net === t)!.volts > 0);
  const rail = highRail !== undefined ? nl.rails.find((r) => r.net === highRail)! : nl.rails.find((r) => r.volts > 0);
  if (!node.family.match(/gate/) && !rail) return;
  const vcc = rail?.volts ?? 5;
  const added: AddedDevice[] = [];
  if (node.family === 'gate') {
    for (const s of stages) added.push(...openDrainGate(ctx, idx, s));
  } else {
    const controls = new Set([...removed].map((d) => nl.devices[d].terminals[1]));
    for (const n of controls) {
      const drv = idx.nodeOfNet(n);
      if (!drv || drv.kind !== 'static' || idx.ports.has(n) || !idx.ownsAlone(drv)) continue;
      if (idx.loads(n).every((l) => removed.has(l.device))) for (const d of drv.devices) removed.add(d);
    }
  }
  const loads = idx.loadCount(node.net);
  const { resistor, margins } = sizePullUp(ctx, o, { vcc, loads, drivers: stages.length, family: node.family as MapFamily });
  let name = `RPU_${node.name.replace(/[^A-Za-z0-9]/g, '_')}`;
  while (nl.netByName.has(name) || nl.devices.some((d) => d.name === name)) name += '_';
  if (node.family === 'gate') added.push({ name, kind: 'gate', op: 'pullup', terminals: [node.name] });
  else added.push({ name, kind: 'resistor', terminals: [nl.nets[rail!.net].name, node.name], value: resistor });
  const edit = { ...emptyEdit(), removeDevices: [...removed].map((d) => nl.devices[d].name), addDevices: added };
  const common = { bus: node.name, drivers: stages.length, places, resistor: formatOhms(resistor) };
  const location = {
    devices: stages.flatMap((s) => s.devices.map((d) => nl.devices[d].name)),
    instances: instancesOf(stages.flatMap((s) => s.devices.map((d) => nl.devices[d].path))),
    nets: [node.name],
  };
  const title = `open-drain drive on ${node.name} with one ${formatOhms(resistor)} pull-up`;
  if (verdict.verdict === 'proved') {
    ctx.report({ messageId: 'slim', data: { ...common, relies: verdict.assumptionsUsed.length ? listWords(verdict.assumptionsUsed) : 'the design itself' }, location, proposals: [{ title, edit, assumptions: verdict.assumptionsUsed, margins }] });
    return;
  }
  const cex = Object.entries(verdict.counterexample).map(([k, val]) => `${k}=${val}`).join(', ');
  const out = verdict.outputs[0];
  ctx.report({ messageId: 'needsOneHot', data: { ...common, cex, before: out.before, after: out.after }, location, proposals: [{ title, edit, assumptions: [], margins }] });
}

/** One gate that pulls the line low exactly when the stage would drive 0, released otherwise. */
function openDrainGate(ctx: RuleContext, idx: NetIndex, s: Stage): AddedDevice[] {
  const nl = ctx.netlist;
  const dev = nl.devices[s.gate!.device];
  const [out, data, en] = dev.terminals.map((t) => nl.nets[t].name);
  const extra: AddedDevice[] = [];
  // the complement of the data net: an existing inverter's input, or a new inverter
  const complement = (net: string): string => {
    const n = idx.nodeOfNet(idx.netId(net)!);
    if (n && n.fn.op === 'not' && n.fn.arg.op === 'var') return n.fn.arg.name;
    extra.push({ name: `${dev.name}_INV`, kind: 'gate', op: 'not', terminals: [`${dev.name}_N`, net], path: [...dev.path] });
    return `${dev.name}_N`;
  };
  // wired-AND value of the stage = !(pulls low): bufif1 !(en & !d); notif1 !(en & d); bufif0 enb | d; notif0 enb | !d
  const op = s.gate!.op;
  const gate: AddedDevice =
    op === 'bufif1'
      ? { name: dev.name, kind: 'gate', op: 'nand', terminals: [out, en, complement(data)], path: [...dev.path] }
      : op === 'notif1'
        ? { name: dev.name, kind: 'gate', op: 'nand', terminals: [out, en, data], path: [...dev.path] }
        : op === 'bufif0'
          ? { name: dev.name, kind: 'gate', op: 'or', terminals: [out, en, data], path: [...dev.path] }
          : { name: dev.name, kind: 'gate', op: 'or', terminals: [out, en, complement(data)], path: [...dev.path] };
  return [gate, ...extra];
}

/**
 * Pull-up from the E-series inside R ≥ (V_CC,max − V_OL,max)/(I_OL,max − Σ I_IL) and
 * R ≤ (V_CC,min − V_IH,min)/(Σ I_leak + Σ I_IH) (common practice), kept under the rise-time
 * limit t_r ≈ 2.2·R·C ≤ fraction·T (Elmore 1948; Rubinstein, Penfield, Horowitz 1983): the largest
 * such value (least static power); when none fits, the smallest above R_min, and margins fail.
 */
export function sizePullUp(
  ctx: Pick<RuleContext, 'margins' | 'clockPeriod'>,
  o: Options,
  line: { vcc: number; loads: number; drivers: number; family: MapFamily },
): { resistor: number; margins: MarginResult[] } {
  const s = ctx.margins;
  const vccMax = line.vcc * (1 + s.supplyTolerance);
  const vccMin = line.vcc * (1 - s.supplyTolerance);
  const vih = thresholdsFor(line.family, vccMin, s).vih;
  const sink = o.iolMax - line.loads * o.iilPerLoad;
  const rMin = sink > 0 ? (vccMax - o.volMax) / sink : Infinity;
  const leak = line.drivers * o.leakPerDriver + line.loads * o.iihPerLoad;
  const rMax = leak > 0 ? (vccMin - vih) / leak : Infinity;
  const c = lineCapacitance(line.loads, s, o.lineCapacitance);
  const period = ctx.clockPeriod ?? o.clockPeriod;
  const rRise = (s.riseFraction * period) / (RISE_FACTOR * c * (1 + s.resistorTolerance));
  const lo = rMin / (1 - s.resistorTolerance);
  const hi = Math.min(rMax / (1 + s.resistorTolerance), rRise);
  const values = seriesValues(o.series);
  const inside = values.filter((r) => r >= lo && r <= hi);
  const resistor = inside.length ? inside[inside.length - 1] : (values.find((r) => r >= lo) ?? values[values.length - 1]);
  const rLow = resistor * (1 - s.resistorTolerance);
  const rHigh = resistor * (1 + s.resistorTolerance);
  const margins: MarginResult[] = [
    {
      name: 'pull-up against sink limit',
      value: rLow,
      limit: rMin,
      unit: 'Ω',
      status: statusAtLeast(rLow, rMin, s),
      corner: { supply: round(vccMax), resistors: `R_pull-up −${Math.round(s.resistorTolerance * 100)} %` },
      note: `R ≥ (V_CC,max − V_OL,max)/(I_OL,max − Σ I_IL) with V_OL,max ${o.volMax} V, I_OL,max ${round(o.iolMax * 1e3)} mA, ${line.loads} load(s) (common practice; use the driver's data sheet)`,
      inputs: { check: 'pull-up-min', vcc: line.vcc, pullUp: resistor, volMax: o.volMax, iolMax: o.iolMax, iilPerLoad: o.iilPerLoad, loads: line.loads },
    },
    {
      name: 'pull-up against high level',
      value: rHigh,
      limit: rMax,
      unit: 'Ω',
      status: statusAtMost(rHigh, rMax, s),
      corner: { supply: round(vccMin), resistors: `R_pull-up +${Math.round(s.resistorTolerance * 100)} %` },
      note: `R ≤ (V_CC,min − V_IH,min)/(Σ I_leak + Σ I_IH) with V_IH ${round(vih)} V, ${line.drivers} driver(s), ${line.loads} load(s) (common practice)`,
      inputs: { check: 'pull-up-max', vcc: line.vcc, pullUp: resistor, family: line.family, leakPerDriver: o.leakPerDriver, drivers: line.drivers, iihPerLoad: o.iihPerLoad, loads: line.loads },
    },
    // loads (and the line's own figure when the options give one) let a what-if recompute C.
    riseTime({ vcc: line.vcc, pullUp: resistor, capacitance: c, clockPeriod: period, loads: line.loads, ...(o.lineCapacitance !== undefined ? { lineCapacitance: o.lineCapacitance } : {}) }, s),
    staticPower({ vcc: line.vcc, pullUps: [resistor] }, s),
  ];
  return { resistor, margins };
}

