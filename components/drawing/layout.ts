// Lays a region graph out with elkjs (layered, orthogonal wires, ports fixed at the symbols' pins)
// and returns absolute positions: one placed part per part, one placed net per net (its wires, rail
// glyphs, stubs and a single label). Pure and deterministic: same graph in, same drawing out.
import ELK from 'elkjs/lib/elk.bundled.js';
import type { ElkExtendedEdge, ElkNode } from 'elkjs/lib/elk-api';
import type { RegionGraph, RegionNet, RegionPart } from '@/optimizer/region/graph';
import { geometryOf, stubEnd, type Pin, type SymbolGeometry } from './symbol-geometry';

export interface Point { x: number; y: number }

export interface PlacedPart {
  part: RegionPart;
  geometry: SymbolGeometry;
  x: number;
  y: number;
}

/** A terminal on a rail or on a net with no other terminal here: drawn as a short stub and a glyph. */
export interface Stub { from: Point; to: Point; side: Pin['side'] }

export interface PlacedNet {
  net: RegionNet;
  /** Orthogonal polylines between this net's pins. */
  wires: Point[][];
  /** Junction dots where three or more wires meet. */
  junctions: Point[];
  stubs: Stub[];
  label: Point;
}

export interface Drawing {
  width: number;
  height: number;
  parts: PlacedPart[];
  nets: PlacedNet[];
}

const elk = new ELK();
/** Above this many parts the layout trades some polish for speed. */
export const LARGE = 60;
const MARGIN = 24;

/** Gate-level regions flow left to right (signals), transistor regions top to bottom (supply to ground). */
export function directionOf(graph: RegionGraph): 'RIGHT' | 'DOWN' {
  const gates = graph.parts.filter((p) => p.kind === 'gate').length;
  return gates * 2 >= graph.parts.length && gates > 0 ? 'RIGHT' : 'DOWN';
}

const portId = (part: number, pin: string) => `p${part}:${pin}`;
const SIDE = { N: 'NORTH', S: 'SOUTH', E: 'EAST', W: 'WEST' } as const;
/** Terminals that drive a net, preferred as an edge's source so wires flow from drivers to readers. */
const DRIVING = new Set(['y', 'c', 'd', 'p']);

export async function layoutRegion(graph: RegionGraph, extraOptions: Record<string, string> = {}): Promise<Drawing> {
  const geometries = graph.parts.map((p) => geometryOf(p));
  const pinOf = (i: number, name: string) => geometries[i].pins.find((p) => p.name === name);
  // Terminals per net, in part order (deterministic).
  const ends = new Map<string, { part: number; pin: Pin }[]>();
  graph.parts.forEach((p, i) =>
    p.terminals.forEach((t) => {
      const pin = pinOf(i, t.name);
      if (!pin) return;
      const list = ends.get(t.net) ?? [];
      list.push({ part: i, pin });
      ends.set(t.net, list);
    }),
  );
  const netByName = new Map(graph.nets.map((n) => [n.name, n]));
  const isRail = (name: string) => netByName.get(name)?.railVolts !== undefined;

  const edges: ElkExtendedEdge[] = [];
  const edgeNet: string[] = [];
  for (const net of graph.nets) {
    const list = ends.get(net.name) ?? [];
    if (isRail(net.name) || list.length < 2) continue;
    const k = Math.max(0, list.findIndex((e) => DRIVING.has(e.pin.name)));
    const src = list[k];
    list.forEach((e, j) => {
      if (j === k) return;
      edges.push({ id: `e${edges.length}`, sources: [portId(src.part, src.pin.name)], targets: [portId(e.part, e.pin.name)] });
      edgeNet.push(net.name);
    });
  }
  const large = graph.parts.length > LARGE;
  const root: ElkNode = {
    id: 'root',
    layoutOptions: {
      'elk.algorithm': 'layered',
      'elk.direction': directionOf(graph),
      'elk.edgeRouting': 'ORTHOGONAL',
      'elk.randomSeed': '1',
      'elk.spacing.nodeNode': '56',
      'elk.layered.spacing.nodeNodeBetweenLayers': '48',
      'elk.spacing.edgeNode': '16',
      'elk.spacing.edgeEdge': '10',
      'elk.layered.mergeEdges': 'true',
      // Large regions: fewer crossing sweeps, simple placement, no component packing — together
      // about a third of the time (see layout-bench.ts), so a few hundred parts stay under a second.
      'elk.layered.nodePlacement.strategy': large ? 'SIMPLE' : 'BRANDES_KOEPF',
      'elk.separateConnectedComponents': large ? 'false' : 'true',
      'elk.layered.thoroughness': large ? '1' : '7',
      ...extraOptions,
    },
    children: graph.parts.map((_, i) => ({
      id: `n${i}`,
      width: geometries[i].width,
      height: geometries[i].height,
      layoutOptions: { 'elk.portConstraints': 'FIXED_POS' },
      ports: geometries[i].pins.map((p) => ({ id: portId(i, p.name), x: p.x, y: p.y, width: 0, height: 0, layoutOptions: { 'elk.port.side': SIDE[p.side] } })),
    })),
    edges,
  };
  const out = await elk.layout(root);
  const pos = new Map((out.children ?? []).map((c) => [c.id, { x: (c.x ?? 0) + MARGIN, y: (c.y ?? 0) + MARGIN }]));
  const parts: PlacedPart[] = graph.parts.map((part, i) => ({ part, geometry: geometries[i], ...pos.get(`n${i}`)! }));
  const abs = (i: number, p: Pin): Point => ({ x: parts[i].x + p.x, y: parts[i].y + p.y });

  const wiresOf = new Map<string, Point[][]>();
  (out.edges ?? []).forEach((e, k) => {
    const net = edgeNet[k];
    const list = wiresOf.get(net) ?? [];
    for (const s of (e as ElkExtendedEdge).sections ?? []) {
      list.push([s.startPoint, ...(s.bendPoints ?? []), s.endPoint].map((p) => ({ x: p.x + MARGIN, y: p.y + MARGIN })));
    }
    wiresOf.set(net, list);
  });

  const nets: PlacedNet[] = graph.nets.map((net) => {
    const list = ends.get(net.name) ?? [];
    const wires = wiresOf.get(net.name) ?? [];
    const stubs: Stub[] =
      isRail(net.name) || wires.length === 0
        ? list.map((e) => {
            const from = abs(e.part, e.pin);
            const end = stubEnd(e.pin);
            return { from, to: { x: parts[e.part].x + end.x, y: parts[e.part].y + end.y }, side: e.pin.side };
          })
        : [];
    const first = list[0];
    const label = stubs[0]?.to ?? (first ? abs(first.part, first.pin) : { x: MARGIN, y: MARGIN });
    return { net, wires, junctions: junctionsOf(wires), stubs, label };
  });

  let width = 0;
  let height = 0;
  const grow = (p: Point) => {
    width = Math.max(width, p.x);
    height = Math.max(height, p.y);
  };
  for (const p of parts) grow({ x: p.x + p.geometry.width, y: p.y + p.geometry.height });
  for (const n of nets) {
    n.wires.flat().forEach(grow);
    n.stubs.forEach((s) => grow(s.to));
  }
  return { width: width + MARGIN * 2, height: height + MARGIN * 2, parts, nets };
}

/** Points where wires of one net meet and branch (the end of one wire lying on another, or 3+ ends). */
function junctionsOf(wires: Point[][]): Point[] {
  const count = new Map<string, number>();
  for (const w of wires) for (const p of w) count.set(`${p.x},${p.y}`, (count.get(`${p.x},${p.y}`) ?? 0) + 1);
  const starts = new Map<string, number>();
  for (const w of wires) {
    const k = `${w[0].x},${w[0].y}`;
    starts.set(k, (starts.get(k) ?? 0) + 1);
  }
  const out: Point[] = [];
  for (const [k, n] of count) {
    if (n >= 3 && (starts.get(k) ?? 0) < n) {
      const [x, y] = k.split(',').map(Number);
      out.push({ x, y });
    }
  }
  return out;
}
