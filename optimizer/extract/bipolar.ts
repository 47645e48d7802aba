// Bipolar collector-node groups: a collector node with its pull-up resistor(s) and the NPN stacks
// that can pull it down (series = AND, parallel = OR), each transistor's base resolved through its
// base network (resistor = that net, several resistors = OR, DTL diode inputs with a pull-up = AND).
import { and, not, or, TRUE, type Expr } from '../logic/expr';
import type { FlatDevice } from '../netlist/ir';
import type { BaseDrive, DriverGroup, Family, LogicNode, PullUp, SwitchNetwork } from './types';
import {
  commonPath,
  eachTerminal,
  isHighRail,
  isLowRail,
  isRail,
  netName,
  otherEnd,
  varOf,
  type ExtractContext,
} from './context';
import { nodePullUp, withNodePullUp } from './node-pull-ups';
import { eachDiodeTap, isBleed } from './diode-taps';
import { fit } from './fit';
import { empty } from '../netlist/empty';

// Shared empty lists for the common (non-DTL) base drive: most transistors have none of these.
const NONE: number[] = Object.freeze([]) as unknown as number[];

export { fit } from './fit';

const C = 0;
const B = 1;
const E = 2;

function isNpn(cx: ExtractContext, d: number): boolean {
  return cx.nl.devices[d].kind === 'npn';
}

/** Resistors from a net to a positive rail. */
export function resistorPullUps(cx: ExtractContext, net: number): PullUp[] {
  const out: PullUp[] = [];
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    const dev = cx.nl.devices[d];
    if (dev.kind !== 'resistor') continue;
    const o = otherEnd(cx, d, termIdx[i]);
    if (o !== net && isHighRail(cx, o)) {
      out.push({ device: d, kind: 'resistor', ohms: dev.value, rail: o, railVolts: cx.railVolts[o] });
    }
  }
  return out.length ? fit(out) : out;
}

/**
 * A stack node: an internal net of a series pull-down stack. Only NPN collectors and emitters
 * touch it (and at least one of each), so it is not a gate output of its own.
 */
export function isStackNode(cx: ExtractContext, net: number): boolean {
  if (isRail(cx, net)) return false;
  let collectors = 0;
  let emitters = 0;
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const t = termIdx[i];
    if (!isNpn(cx, termDev[i]) || (t !== C && t !== E)) return false;
    if (t === C) collectors++;
    else emitters++;
  }
  return collectors > 0 && emitters > 0;
}

/** Emitter nets that count as ground: low rails, or a net that reaches ground only through resistors. */
function emitterGrounded(cx: ExtractContext, net: number): boolean {
  if (isLowRail(cx, net)) return true;
  let toGround = false;
  const { offsets, termDev, termIdx } = cx;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const d = termDev[i];
    const t = termIdx[i];
    const dev = cx.nl.devices[d];
    if (dev.kind === 'npn' && t === E) continue;
    if (dev.kind === 'resistor' && isLowRail(cx, otherEnd(cx, d, t))) toGround = true;
    else if (dev.kind !== 'capacitor') return false;
  }
  return toGround;
}

/** Scratch lists of BaseResolver.resolve (not reentrant: resolving one base never resolves another). */
const scratchInputs: number[] = [];
const scratchResistors: BaseDrive['baseResistors'] = [];
const scratchDevices: number[] = [];

/** A drive before resolve() fills it: direct, always on, its lists the shared scratch ones. */
function startDrive(transistor: number): BaseDrive {
  return {
    transistor,
    kind: 'direct',
    inputs: scratchInputs,
    on: TRUE,
    baseResistors: scratchResistors,
    inputDiodes: NONE,
    levelShiftDiodes: NONE,
    devices: scratchDevices,
  };
}

/** The terms of a base's OR, read into `on` before resolve returns. */
const scratchTerms: Expr[] = [];

export class BaseResolver {
  private readonly cache: (BaseDrive | undefined)[];
  /** Nets absorbed into base networks (DTL diode nodes): part of a gate, not signals. */
  readonly absorbed = new Set<number>();
  /**
   * The one drive transient() fills, again and again. A drive per call would be garbage at once,
   * and once an extraction has kept a million of them the engine allocates that kind of object
   * straight in the long-lived heap, where only a full collection frees it.
   */
  private readonly spare: BaseDrive = Object.assign(startDrive(-1), { diodePullUp: undefined, bleed: undefined });
  constructor(private readonly cx: ExtractContext) {
    this.cache = new Array(cx.nl.devices.length);
  }

  drive(transistor: number): BaseDrive {
    let hit = this.cache[transistor];
    if (!hit) {
      hit = this.resolve(transistor, startDrive(transistor));
      hit.inputs = fit(hit.inputs);
      hit.baseResistors = fit(hit.baseResistors);
      hit.devices = fit(hit.devices);
      this.cache[transistor] = hit;
    }
    return hit;
  }

  /**
   * The base drive without keeping it: its lists are the resolver's scratch, valid until the next
   * call. For a caller that reads each drive once and keeps only what it derives (the switch model
   * compiles it), so a million transistors leave no million cached drives behind.
   */
  transient(transistor: number): BaseDrive {
    const hit = this.cache[transistor];
    if (hit) return hit;
    const d = this.spare;
    d.transistor = transistor;
    d.kind = 'direct';
    d.inputs = scratchInputs;
    d.on = TRUE;
    d.baseResistors = scratchResistors;
    d.inputDiodes = NONE;
    d.levelShiftDiodes = NONE;
    d.devices = scratchDevices;
    d.diodePullUp = undefined;
    d.bleed = undefined;
    return this.resolve(transistor, d);
  }

  /** Fills `drive` (its lists the shared scratch ones) with the transistor's base drive. */
  private resolve(transistor: number, drive: BaseDrive): BaseDrive {
    const cx = this.cx;
    const base = cx.nl.devices[transistor].terminals[B];
    // The lists are gathered in shared scratch arrays; drive() keeps exact-size copies.
    empty(scratchInputs);
    empty(scratchResistors);
    empty(scratchDevices);
    if (isRail(cx, base)) {
      drive.on = { op: 'const', value: isHighRail(cx, base) ? 1 : 0 };
      return drive;
    }
    const terms = scratchTerms;
    empty(terms);
    let direct = false;
    let diodeAnd = false;
    // a plain loop over the terminal index: a closure here would be allocated per transistor
    const { offsets, termDev, termIdx } = cx;
    for (let i = offsets[base], end = offsets[base + 1]; i < end; i++) {
      const d = termDev[i];
      const t = termIdx[i];
      const dev = cx.nl.devices[d];
      if (dev.kind === 'npn' && t === B) continue; // this or a paralleled base
      if (dev.kind === 'resistor') {
        const from = otherEnd(cx, d, t);
        if (isLowRail(cx, from)) {
          drive.bleed = d;
          drive.devices.push(d);
          continue;
        }
        drive.baseResistors.push({ device: d, ohms: dev.value, from });
        drive.devices.push(d);
        if (isHighRail(cx, from)) terms.push(TRUE);
        else {
          drive.inputs.push(from);
          terms.push(varOf(cx, from));
        }
        continue;
      }
      if (dev.kind === 'diode' && t === 1) {
        const dtl = this.diodeInputs(d, base, drive);
        if (dtl) {
          terms.push(dtl);
          diodeAnd = true;
          continue;
        }
      }
      if (dev.kind === 'capacitor') continue; // speed-up capacitors do not change the logic
      direct = true;
    }
    if (!direct && terms.length === 0 && drive.bleed !== undefined) {
      // only a resistor to ground (or a base tied low through one): the transistor stays off
      drive.kind = 'resistor';
      drive.on = { op: 'const', value: 0 };
      return drive;
    }
    if (direct || terms.length === 0) {
      // driven straight by another stage (or an undriven input): the base net is the signal
      terms.push(varOf(cx, base));
      drive.inputs.push(base);
      drive.kind = 'direct';
    } else if (diodeAnd) drive.kind = 'diode-and';
    else drive.kind = drive.baseResistors.length > 1 ? 'resistor-sum' : 'resistor';
    // one variable is its own OR (what or() would return), without the argument lists
    drive.on = terms.length === 1 && terms[0].op === 'var' ? terms[0] : or(...terms);
    return drive;
  }

  /**
   * DTL input: level-shift diode(s) from a pulled-up node P down to the base, input diodes with
   * anodes at P and cathodes at the inputs. The base turns on when every input is high.
   */
  private diodeInputs(first: number, base: number, drive: BaseDrive): Expr | undefined {
    const cx = this.cx;
    const shift = [first];
    let p = cx.nl.devices[first].terminals[0];
    for (let guard = 0; guard < 8; guard++) {
      if (isRail(cx, p)) return undefined;
      const pulls = resistorPullUps(cx, p);
      if (pulls.length) {
        const inputs: number[] = [];
        const inputDiodes: number[] = [];
        let driven = false;
        eachTerminal(cx, p, (d, t) => {
          const dev = cx.nl.devices[d];
          if (dev.kind === 'diode' && t === 0 && !shift.includes(d)) {
            inputDiodes.push(d);
            inputs.push(dev.terminals[1]);
          } else if (dev.kind !== 'resistor' && dev.kind !== 'diode' && dev.kind !== 'capacitor') driven = true;
        });
        // A pulled-up node that a transistor or gate also drives, or that no input diode reads
        // into, is not a diode gate's node but a signal with its own pull-up (another stage's
        // output), coupled to the base like any other signal. Read as a gate, its other fan-out
        // diodes would be inputs, or with none an AND of nothing: a base always on.
        if (driven || inputDiodes.length === 0) return this.coupledFrom(p, shift, drive);
        drive.levelShiftDiodes = shift;
        drive.inputDiodes = inputDiodes;
        drive.diodePullUp = pulls[0];
        drive.devices.push(...shift, ...inputDiodes, ...pulls.map((u) => u.device));
        drive.inputs.push(...inputs);
        this.absorbed.add(p);
        return and(...inputs.map((n) => (isRail(cx, n) ? ({ op: 'const', value: isHighRail(cx, n) ? 1 : 0 } as Expr) : varOf(cx, n))));
      }
      // another level-shift diode further up: exactly one diode with its cathode at p
      let up = -1;
      let count = 0;
      eachTerminal(cx, p, (d, t) => {
        if (cx.nl.devices[d].kind === 'diode' && t === 1) {
          up = d;
          count++;
        }
      });
      if (count === 0) return this.coupledFrom(p, shift, drive);
      if (count !== 1) return undefined;
      // A chain that climbs back to the base (or to a node it already passed) is a loop, not an
      // input: compare nets with nets — a device number equal to the base's net number is no loop.
      const anode = cx.nl.devices[up].terminals[0];
      if (anode === base || shift.some((d) => cx.nl.devices[d].terminals[0] === anode)) return undefined;
      shift.push(up);
      p = anode;
    }
    return undefined;
  }

  /**
   * Diode-coupled base: level-shift diode(s) straight from a net with no pull-up of its own
   * (another stage's output, an input), or from a lone series resistor off one. The base turns on
   * when that signal is high, so the signal is the input; the base net itself, read as the
   * variable, would leave an enable stack's base a free input of every proof.
   */
  private coupledFrom(p: number, shift: number[], drive: BaseDrive): Expr {
    const cx = this.cx;
    const top = shift[shift.length - 1];
    let resistor = -1;
    let others = 0;
    eachTerminal(cx, p, (d) => {
      if (d === top) return;
      if (cx.nl.devices[d].kind === 'resistor' && resistor < 0 && !isRail(cx, otherEnd(cx, d, cx.nl.devices[d].terminals[0] === p ? 0 : 1))) resistor = d;
      else others++;
    });
    let input = p;
    drive.levelShiftDiodes = [...drive.levelShiftDiodes, ...shift];
    drive.devices.push(...shift);
    if (resistor >= 0 && others === 0) {
      const r = cx.nl.devices[resistor];
      input = otherEnd(cx, resistor, r.terminals[0] === p ? 0 : 1);
      drive.baseResistors.push({ device: resistor, ohms: r.value, from: input });
      drive.devices.push(resistor);
    }
    drive.inputs.push(input);
    return varOf(cx, input);
  }
}

/**
 * The branches pullDownNetwork gathers, one scratch list per depth (a call only ever recurses one
 * level deeper): only an exact-size copy is kept, so a list per call would be garbage at once.
 */
const scratchBranches: SwitchNetwork[][] = [];

/** Pull-down network from a net to ground through NPN collector–emitter paths. */
function pullDownNetwork(cx: ExtractContext, bases: BaseResolver, net: number, depth: number, used: number[]): SwitchNetwork | undefined {
  if (depth > 16) return undefined;
  const branches = (scratchBranches[depth] ??= []);
  empty(branches);
  const { offsets, termDev, termIdx } = cx;
  const start = offsets[net];
  const end = offsets[net + 1];
  let diodes = false;
  for (let i = start; i < end; i++) {
    const d = termDev[i];
    const dev = cx.nl.devices[d];
    if (dev.kind === 'diode' && termIdx[i] === 0) diodes = true;
    if (dev.kind !== 'npn' || termIdx[i] !== C) continue;
    const e = dev.terminals[E];
    const sw: SwitchNetwork = { type: 'switch', device: d, on: bases.drive(d).on };
    if (emitterGrounded(cx, e)) {
      used.push(d);
      branches.push(sw);
    } else if (isStackNode(cx, e)) {
      const rest = pullDownNetwork(cx, bases, e, depth + 1, used);
      if (rest) {
        used.push(d);
        branches.push({ type: 'series', parts: [sw, ...(rest.type === 'series' ? rest.parts : [rest])] });
      }
    }
  }
  // Steering diodes (anode on this line, cathode on a common override node): the line is pulled
  // low whenever that node's own pull-down conducts; the diodes block the other way.
  for (let i = start; diodes && i < end; i++) {
    const dev = cx.nl.devices[termDev[i]];
    if (dev.kind !== 'diode' || termIdx[i] !== 0 || !isSteeringNode(cx, dev.terminals[1])) continue;
    const rest = steeredPullDown(cx, bases, dev.terminals[1], depth + 1, used);
    if (rest) branches.push(rest);
  }
  if (branches.length === 0) return undefined;
  return branches.length === 1 ? branches[0] : { type: 'parallel', parts: fit(branches) };
}

const steeredMemo = new WeakMap<ExtractContext, Map<string, { net: SwitchNetwork | undefined; used: number[] }>>();

/**
 * The pull-down of a common override node, worked out once per extraction: every line it steers
 * asks for it, and walking the node's own terminals each time costs O(lines²) on a wide bank.
 */
function steeredPullDown(cx: ExtractContext, bases: BaseResolver, net: number, depth: number, used: number[]): SwitchNetwork | undefined {
  let memo = steeredMemo.get(cx);
  if (!memo) steeredMemo.set(cx, (memo = new Map()));
  const key = `${net}:${depth}`;
  const hit = memo.get(key);
  if (hit) {
    for (const d of hit.used) used.push(d);
    return hit.net;
  }
  const mark = used.length;
  const result = pullDownNetwork(cx, bases, net, depth, used);
  memo.set(key, { net: result, used: used.slice(mark) });
  return result;
}

/**
 * A steering node: only NPN collectors and diode cathodes touch it (at least one of each), it has
 * no pull-up of its own, and every diode's anode sits on a resistor-pulled collector line — the
 * common node of an override transistor shared by several lines through steering diodes.
 */
export function isSteeringNode(cx: ExtractContext, net: number): boolean {
  const memo = (cx.steering ??= new Uint8Array(cx.nl.nets.length));
  if (memo[net] === 0) memo[net] = steeringNode(cx, net) ? 1 : 2;
  return memo[net] === 1;
}

/**
 * The test itself: linear in the net's terminals plus the terminals of each diode's anode line.
 * Asked once per net (memoised above), so k lines on one override node cost O(k) in all, not O(k²).
 */
function steeringNode(cx: ExtractContext, net: number): boolean {
  if (isRail(cx, net)) return false;
  let collectors = 0;
  let diodes = 0;
  const { offsets, termDev, termIdx } = cx;
  // a first pass that needs no allocation: most collector nets have no diode cathode at all
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const dev = cx.nl.devices[termDev[i]];
    const t = termIdx[i];
    if (dev.kind === 'npn' && t === C) collectors++;
    else if (dev.kind === 'diode' && t === 1) diodes++;
    else if (!isBleed(cx, termDev[i], t)) return false; // a diode-OR node's bleed may stay (diode-taps.ts)
  }
  if (collectors === 0 || diodes === 0) return false;
  for (let i = offsets[net], end = offsets[net + 1]; i < end; i++) {
    const dev = cx.nl.devices[termDev[i]];
    if (dev.kind !== 'diode') continue;
    const anode = dev.terminals[0];
    if (anode === net) return false;
    let lineCollector = false;
    let pulledUp = false;
    for (let j = offsets[anode], e2 = offsets[anode + 1]; j < e2; j++) {
      const d = termDev[j];
      const k = cx.nl.devices[d].kind;
      if (k === 'npn' && termIdx[j] === C) lineCollector = true;
      else if (k === 'resistor') {
        const o = otherEnd(cx, d, termIdx[j]);
        if (o !== anode && isHighRail(cx, o)) pulledUp = true;
      }
    }
    if (!lineCollector || !pulledUp) return false;
  }
  return true;
}

export function networkCondition(n: SwitchNetwork): Expr {
  switch (n.type) {
    case 'switch':
      return n.on;
    case 'series':
      return and(...n.parts.map(networkCondition));
    case 'parallel':
      return or(...n.parts.map(networkCondition));
  }
}

/**
 * Every collector node of the design with its groups; stack nodes and rails are left out.
 * @param only when given, just the collector nets marked 1 are analysed (an edited design's changed nets)
 */
export function extractBipolar(cx: ExtractContext, bases: BaseResolver, only?: Uint8Array): LogicNode[] {
  const nodes: LogicNode[] = [];
  const seen = new Uint8Array(cx.nl.nets.length);
  const dedup = new DeviceSet(cx.nl.devices.length);
  const devices = cx.nl.devices;
  for (let di = 0; di < devices.length; di++) {
    const dev = devices[di];
    if (dev.kind !== 'npn') continue;
    const net = dev.terminals[C];
    if ((only && !only[net]) || seen[net] || isRail(cx, net) || isStackNode(cx, net) || isSteeringNode(cx, net)) continue;
    seen[net] = 1;
    const node = collectorNode(cx, bases, net, dedup);
    if (node) nodes.push(node);
    else {
      cx.diagnostics.push({
        severity: 'warning',
        code: 'extract.no-pull-down',
        message: `${dev.name}: collector net ${netName(cx, net)} has no pull-down path to ground; left out of the logic view`,
        loc: dev.loc,
      });
    }
  }
  return nodes;
}

/** Lists of device ids without repeats, in first-seen order, with no Set per list. */
class DeviceSet {
  private readonly mark: Int32Array;
  private stamp = 0;
  constructor(n: number) {
    this.mark = new Int32Array(n);
  }
  begin(): void {
    this.stamp++;
  }
  /** Appends d to out unless it was added since the last begin(). */
  add(out: number[], d: number): void {
    if (this.mark[d] === this.stamp) return;
    this.mark[d] = this.stamp;
    out.push(d);
  }
}

/** `used` of pullDownNetwork, reused: collector nodes do not read it. */
const scratchUsed: number[] = [];
/** Scratch lists of collectorNode: a group's devices and the node's; only exact-size copies are kept. */
const scratchGroup: number[] = [];
const scratchNode: number[] = [];
const scratchDrives: BaseDrive[] = [];

const samePath = (p: string[], q: string[]): boolean => p === q || (p.length === q.length && p.every((x, i) => x === q[i]));

/** Whether every branch's first switch was made in the instance at `path`. */
function allFrom(devs: readonly FlatDevice[], branches: readonly SwitchNetwork[], path: string[]): boolean {
  for (let i = 0; i < branches.length; i++) if (!samePath(devs[firstSwitch(branches[i])].path, path)) return false;
  return true;
}

/** The switches of the group being built (collectorNode reads them, keeps none of the list). */
const scratchSwitches: number[] = [];

function collectorNode(cx: ExtractContext, bases: BaseResolver, net: number, dedup: DeviceSet): LogicNode | undefined {
  empty(scratchUsed);
  const pd = pullDownNetwork(cx, bases, net, 0, scratchUsed);
  if (!pd) return undefined;
  const pullUps = resistorPullUps(cx, net);
  // Independent groups: the branches made in different instances (cells) are separate drivers.
  const branches = pd.type === 'parallel' ? pd.parts : [pd];
  const devs = cx.nl.devices;
  const firstPath = devs[firstSwitch(branches[0])].path;
  // Common case: every branch made in one instance, one group; no path keys are built.
  let byPath: { key: string | undefined; path: string[]; brs: SwitchNetwork[] }[];
  if (allFrom(devs, branches, firstPath)) byPath = [{ key: undefined, path: firstPath, brs: branches }];
  else {
    const index = new Map<string, number>();
    byPath = [];
    for (const br of branches) {
      const path = devs[firstSwitch(br)].path;
      const key = path.join('.');
      const at = index.get(key);
      if (at !== undefined) byPath[at].brs.push(br);
      else {
        index.set(key, byPath.length);
        byPath.push({ key, path, brs: [br] });
      }
    }
  }
  const groups: DriverGroup[] = [];
  for (const entry of byPath) {
    const brs = entry.brs;
    const network: SwitchNetwork = brs.length === 1 ? brs[0] : brs === branches ? pd : { type: 'parallel', parts: brs };
    const switches = scratchSwitches;
    empty(switches);
    switchesOf(network, switches);
    empty(scratchDrives);
    for (const sw of switches) scratchDrives.push(bases.drive(sw));
    const baseDrives = fit(scratchDrives);
    // a load belongs to the group of its own instance (paths compared as their dotted names)
    const key = entry.key;
    let dtl = false;
    // gathered in a scratch list, kept as an exact-size copy
    const groupDevices = scratchGroup;
    empty(groupDevices);
    for (const d of switches) groupDevices.push(d);
    for (const b of baseDrives) {
      if (b.kind === 'diode-and') dtl = true;
      for (const d of b.devices) groupDevices.push(d);
    }
    let own = 0;
    for (const u of pullUps) {
      const p = devs[u.device].path;
      if (p === entry.path || p.join('.') === (key ?? entry.path.join('.'))) {
        groupDevices.push(u.device);
        own++;
      }
    }
    groups.push({
      family: dtl ? 'dtl' : 'rtl',
      pullDown: network,
      pullsLow: networkCondition(network),
      pullsHigh: TRUE,
      bases: baseDrives,
      devices: fit(groupDevices),
      path: commonPath(cx, switches),
      openCollector: own === 0,
    });
  }
  const pullsLow = groups.length === 1 ? groups[0].pullsLow : or(...groups.map((g) => g.pullsLow));
  const wired = groups.length > 1 || pullUps.length > 1;
  const kind = wired ? 'wired' : groups[0].openCollector ? 'open-collector' : 'static';
  // a line pulled up through a resistor from a pulled-up node, not a rail (node-pull-ups.ts)
  const fromNode = pullUps.length === 0 ? nodePullUp(cx, net) : undefined;
  if (pullUps.length === 0 && !fromNode) {
    cx.diagnostics.push({
      severity: 'warning',
      code: 'extract.no-pull-up',
      message: `net ${netName(cx, net)} is pulled down but has no pull-up in this design; it needs one outside`,
    });
  }
  const devices = scratchNode;
  empty(devices);
  dedup.begin();
  for (const g of groups) for (const d of g.devices) dedup.add(devices, d);
  for (const u of pullUps) dedup.add(devices, u.device);
  if (fromNode) for (const d of fromNode.devices) dedup.add(devices, d);
  eachDiodeTap(cx, net, (d) => dedup.add(devices, d));
  const fn = fromNode ? withNodePullUp(fromNode, not(pullsLow)) : not(pullsLow);
  return {
    net,
    name: netName(cx, net),
    kind,
    family: groups.some((g) => g.family === 'dtl') ? 'dtl' : 'rtl',
    fn,
    inputs: [],
    devices: fit(devices),
    pullUp: pullUps[0],
    pullUps,
    groups: fit(groups),
  };
}

function firstSwitch(n: SwitchNetwork): number {
  return n.type === 'switch' ? n.device : firstSwitch(n.parts[0]);
}

export function switchesOf(n: SwitchNetwork, into: number[] = []): number[] {
  if (n.type === 'switch') into.push(n.device);
  else for (const p of n.parts) switchesOf(p, into);
  return into;
}
