// Who drives and who reads each net of a logic view: device → owning node, the load devices on a
// net (terminals of devices that are not the net's own driver), and the distinct loads a fan-out
// check counts. Built once per rule run; linear in the design's terminals.
import type { LogicNode, LogicView } from '../../extract/types';
import type { FlatNetlist } from '../../netlist/ir';

export interface Load {
  device: number;
  terminal: number;
  /** Index of the logic node that owns the device, or −1 when no node explains it. */
  owner: number;
}

export class NetIndex {
  /** First node owning each device (−1: none). */
  readonly ownerOf: Int32Array;
  /** How many nodes claim each device (a device claimed twice cannot go with one node). */
  readonly ownerCount: Uint8Array;
  private readonly offsets: Int32Array;
  private readonly termDev: Int32Array;
  private readonly termIdx: Int8Array;
  readonly ports: Set<number>;
  readonly railNets: Set<number>;

  constructor(
    readonly nl: Readonly<FlatNetlist>,
    readonly view: Readonly<LogicView>,
  ) {
    const nDev = nl.devices.length;
    this.ownerOf = new Int32Array(nDev).fill(-1);
    this.ownerCount = new Uint8Array(nDev);
    view.nodes.forEach((n, i) => {
      for (const d of n.devices) {
        if (this.ownerOf[d] < 0) this.ownerOf[d] = i;
        if (this.ownerCount[d] < 255) this.ownerCount[d]++;
      }
    });
    const nNets = nl.nets.length;
    const counts = new Int32Array(nNets + 1);
    for (const d of nl.devices) for (const t of d.terminals) counts[t + 1]++;
    for (let i = 0; i < nNets; i++) counts[i + 1] += counts[i];
    this.offsets = counts.slice();
    const fill = counts.slice(0, nNets);
    this.termDev = new Int32Array(this.offsets[nNets]);
    this.termIdx = new Int8Array(this.offsets[nNets]);
    nl.devices.forEach((d, di) =>
      d.terminals.forEach((t, ti) => {
        const at = fill[t]++;
        this.termDev[at] = di;
        this.termIdx[at] = ti;
      }),
    );
    this.ports = new Set(nl.ports);
    this.railNets = new Set(nl.rails.map((r) => r.net));
  }

  netId(name: string): number | undefined {
    return this.nl.netByName.get(name);
  }

  nodeOfNet(net: number): LogicNode | undefined {
    const i = this.view.nodeByNet.get(net);
    return i === undefined ? undefined : this.view.nodes[i];
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
}
