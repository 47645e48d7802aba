// Who drives and who reads each net of a logic view: device → owning node, the load devices on a
// net (terminals of devices that are not the net's own driver), the distinct loads a fan-out
// check counts, and the loads by kind a shared driver must carry (RTL bases through resistors with
// their collector pull-ups, DTL input diodes with the pull-up the driver sinks, direct inputs).
// Built once per rule run; linear in the design's terminals.
import { resistorPullUps } from '../../extract/bipolar';
import { makeContext, otherEnd, type ExtractContext } from '../../extract/context';
import type { LogicNode, LogicView } from '../../extract/types';
import type { FlatNetlist } from '../../netlist/ir';

export interface ResistorLoad {
  /** Base resistor (device index) and its ohms. */
  resistor: number;
  ohms: number;
  /** The load transistor and its collector pull-up ohms, when it has one. */
  transistor: number;
  collectorPullUp?: number;
}

export interface DiodeLoad {
  diode: number;
  /** Pull-up of the diode node: the current the driver sinks while low. */
  pullUpOhms: number;
}

export interface DriverLoads {
  resistorBases: ResistorLoad[];
  diodeInputs: DiodeLoad[];
  /** Bases on the net itself, MOS gates, gate-level inputs. */
  direct: number;
  total: number;
}

export interface Load {
  device: number;
  terminal: number;
  /** Index of the logic node that owns the device, or −1 when no node explains it. */
  owner: number;
}

/** The tables of an index: linear in the design's terminals, built once per frozen design. */
interface Tables {
  ownerOf: Int32Array;
  ownerCount: Uint8Array;
  cx: ExtractContext;
  baseOn: Int32Array;
  pullUpOhms: Map<number, number | null>;
  ports: Set<number>;
  railNets: Set<number>;
}

function buildTables(nl: Readonly<FlatNetlist>, view: Readonly<LogicView>): Tables {
  const nDev = nl.devices.length;
  const ownerOf = new Int32Array(nDev).fill(-1);
  const ownerCount = new Uint8Array(nDev);
  view.nodes.forEach((n, i) => {
    for (const d of n.devices) {
      if (ownerOf[d] < 0) ownerOf[d] = i;
      if (ownerCount[d] < 255) ownerCount[d]++;
    }
  });
  // Terminals on a net run in device order, so the first base on a net is the lowest-numbered
  // transistor whose base is there: one pass over the devices finds them all.
  const baseOn = new Int32Array(nl.nets.length).fill(-1);
  for (let d = 0; d < nDev; d++) {
    const dev = nl.devices[d];
    if ((dev.kind === 'npn' || dev.kind === 'pnp') && baseOn[dev.terminals[1]] < 0) baseOn[dev.terminals[1]] = d;
  }
  return {
    ownerOf,
    ownerCount,
    // The extraction context's per-net terminal index (devices in order, then terminals in order).
    cx: makeContext(nl as FlatNetlist),
    baseOn,
    pullUpOhms: new Map(),
    ports: new Set(nl.ports),
    railNets: new Set(nl.rails.map((r) => r.net)),
  };
}

/** Tables of frozen designs (netlist, then view): a frozen design cannot change, so every rule of a scan shares them. */
const shared = new WeakMap<object, WeakMap<object, Tables>>();

function tablesOf(nl: Readonly<FlatNetlist>, view: Readonly<LogicView>): Tables {
  const frozen = Object.isFrozen(nl) && Object.isFrozen(view) && Object.isFrozen(nl.devices) && Object.isFrozen(view.nodes);
  if (!frozen) return buildTables(nl, view);
  let byView = shared.get(nl);
  if (!byView) shared.set(nl, (byView = new WeakMap()));
  let t = byView.get(view);
  if (!t) byView.set(view, (t = buildTables(nl, view)));
  return t;
}

export class NetIndex {
  /** First node owning each device (−1: none). */
  readonly ownerOf: Int32Array;
  /** How many nodes claim each device (a device claimed twice cannot go with one node). */
  readonly ownerCount: Uint8Array;
  private readonly offsets: Int32Array;
  private readonly termDev: Int32Array;
  private readonly termIdx: Int8Array;
  /** First bipolar transistor (in terminal order) whose base is on each net (−1: none). */
  private readonly baseOn: Int32Array;
  /** Resistor pull-up ohms found on a net (null: none), asked per collector or diode node. */
  private readonly pullUpOhms: Map<number, number | null>;
  private readonly cx: ExtractContext;
  readonly ports: Set<number>;
  readonly railNets: Set<number>;

  /** The index of a design (its tables shared while the design is frozen; see the constructor). */
  static of(nl: Readonly<FlatNetlist>, view: Readonly<LogicView>): NetIndex {
    return new NetIndex(nl, view);
  }

  /**
   * Cheap for a frozen netlist and view (as a scan freezes them): the tables are built by the
   * first rule that asks and shared by the rest. An unfrozen design gets tables of its own, since
   * it may still change.
   */
  constructor(
    readonly nl: Readonly<FlatNetlist>,
    readonly view: Readonly<LogicView>,
  ) {
    const t = tablesOf(nl, view);
    this.ownerOf = t.ownerOf;
    this.ownerCount = t.ownerCount;
    this.cx = t.cx;
    this.offsets = t.cx.offsets;
    this.termDev = t.cx.termDev;
    this.termIdx = t.cx.termIdx;
    this.baseOn = t.baseOn;
    this.pullUpOhms = t.pullUpOhms;
    this.ports = t.ports;
    this.railNets = t.railNets;
  }

  /** The design's terminal index as extraction helpers take it (shared: read it, never write it). */
  get context(): ExtractContext {
    return this.cx;
  }

  netId(name: string): number | undefined {
    return this.nl.netByName.get(name);
  }

  nodeOfNet(net: number): LogicNode | undefined {
    const i = this.view.nodeByNet.get(net);
    return i === undefined ? undefined : this.view.nodes[i];
  }

  /** Terminals on a net: entries from .. to − 1 of termDevice / termIndex (no allocation). */
  termRange(net: number): { from: number; to: number } {
    return { from: this.offsets[net], to: this.offsets[net + 1] };
  }

  termDevice(at: number): number {
    return this.termDev[at];
  }

  termIndex(at: number): number {
    return this.termIdx[at];
  }

  terminals(net: number): { device: number; terminal: number }[] {
    const out: { device: number; terminal: number }[] = [];
    for (let i = this.offsets[net]; i < this.offsets[net + 1]; i++) out.push({ device: this.termDev[i], terminal: this.termIdx[i] });
    return out;
  }

  /** Terminals on `net` of devices that are not part of the net's own driving node (sources aside). */
  loads(net: number): Load[] {
    const own = new Set(this.nodeOfNet(net)?.devices ?? []);
    return this.terminals(net)
      .filter(({ device }) => !own.has(device) && this.nl.devices[device].kind !== 'vsource' && this.nl.devices[device].kind !== 'isource')
      .map((t) => ({ ...t, owner: this.ownerOf[t.device] }));
  }

  /** Distinct loads for fan-out: one per reading node, one per device no node explains. */
  loadCount(net: number, except: Set<number> = new Set()): number {
    const owners = new Set<number>();
    let external = 0;
    for (const l of this.loads(net)) {
      if (except.has(l.device)) continue;
      if (l.owner < 0) external++;
      else owners.add(l.owner);
    }
    return owners.size + external;
  }

  /** Nodes (indices) reading the net, and whether anything else (port, unexplained device) does. */
  readers(net: number): { nodes: Set<number>; external: boolean } {
    const nodes = new Set<number>();
    let external = this.ports.has(net);
    for (const l of this.loads(net)) {
      if (l.owner < 0) external = true;
      else nodes.add(l.owner);
    }
    return { nodes, external };
  }

  /** True when every device of the node belongs to it alone. */
  ownsAlone(node: LogicNode): boolean {
    return node.devices.every((d) => this.ownerCount[d] === 1);
  }

  private baseTransistor(net: number): number {
    return this.baseOn[net];
  }

  /** Ohms of the first resistor pull-up on a net, looked up once per net. */
  private firstPullUpOhms(net: number): number | undefined {
    let ohms = this.pullUpOhms.get(net);
    if (ohms === undefined) this.pullUpOhms.set(net, (ohms = resistorPullUps(this.cx, net)[0]?.ohms ?? null));
    return ohms ?? undefined;
  }

  private collectorPullUp(transistor: number): number | undefined {
    const col = this.nl.devices[transistor].terminals[0];
    return this.nodeOfNet(col)?.pullUp?.ohms ?? this.firstPullUpOhms(col);
  }

  /** Every terminal on the net by load kind, for a shared driver's margins. */
  driverLoads(net: number): DriverLoads {
    const out: DriverLoads = { resistorBases: [], diodeInputs: [], direct: 0, total: 0 };
    for (let i = this.offsets[net], end = this.offsets[net + 1]; i < end; i++) {
      const d = this.termDev[i];
      const t = this.termIdx[i];
      const dev = this.nl.devices[d];
      if (dev.kind === 'resistor') {
        const far = otherEnd(this.cx, d, t);
        if (far === net) continue;
        const q = this.baseTransistor(far);
        if (q >= 0 && dev.value !== undefined) {
          const pull = this.collectorPullUp(q);
          out.resistorBases.push({ resistor: d, ohms: dev.value, transistor: q, ...(pull !== undefined ? { collectorPullUp: pull } : {}) });
        }
      } else if (dev.kind === 'diode' && t === 1) {
        const ohms = this.firstPullUpOhms(dev.terminals[0]);
        if (ohms !== undefined) out.diodeInputs.push({ diode: d, pullUpOhms: ohms });
      } else if ((dev.kind === 'npn' || dev.kind === 'pnp' || dev.kind === 'nmos' || dev.kind === 'pmos') && t === 1) out.direct++;
      else if (dev.kind === 'gate' && t >= 1 && dev.op !== 'pullup' && dev.op !== 'pulldown') out.direct++;
    }
    out.total = out.resistorBases.length + out.diodeInputs.length + out.direct;
    return out;
  }
}

export function mergeDriverLoads(list: DriverLoads[]): DriverLoads {
  const out: DriverLoads = { resistorBases: [], diodeInputs: [], direct: 0, total: 0 };
  for (const l of list) {
    out.resistorBases.push(...l.resistorBases);
    out.diodeInputs.push(...l.diodeInputs);
    out.direct += l.direct;
    out.total += l.total;
  }
  return out;
}

/** The equal base resistor that loads a line like these do together: N / Σ 1/R_B,i. */
export function equivalentBaseResistor(loads: ResistorLoad[]): number {
  return loads.length / loads.reduce((s, l) => s + 1 / l.ohms, 0);
}
