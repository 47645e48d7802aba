// A board's use of parts, area and cost on a revision, before and after its accepted proposals.
// A device belongs to a board when its instance path starts with one of the board's prefixes (a
// board with no prefixes holds the whole design). Accepted proposals count on a board by the parts
// they remove there minus the parts they add there (an added part without a path counts on every
// board it removes parts from, so shared parts are never forgotten).
import { partsOf } from '@/optimizer/cost/cost';
import { DEFAULT_PARTS_TABLE } from '@/optimizer/cost/parts-table';
import type { MapFamily } from '@/optimizer/logic/family-parts';
import type { FlatNetlist } from '@/optimizer/netlist/ir';
import type { Edit } from '@/optimizer/rules/types';

export type Usage = { parts: number; areaMm2: number; cost: number };

const round = (x: number) => Math.round(x * 1e6) / 1e6;

export function inBoard(instances: readonly string[], devicePath: string): boolean {
  if (instances.length === 0) return true;
  const p = devicePath.toUpperCase();
  return instances.some((prefix) => {
    const q = prefix.toUpperCase();
    return p === q || p.startsWith(q + '.');
  });
}

/** "X3.XEN" for a device named "X3.XEN.Q1" with path ["X3","XEN"]. */
const pathOf = (d: { path: readonly string[] }) => d.path.join('.');

function usageOf(devices: Parameters<typeof partsOf>[0], family: MapFamily): Usage {
  const s = partsOf(devices, family, DEFAULT_PARTS_TABLE);
  return { parts: s.transistors + s.resistors + s.diodes + s.capacitors, areaMm2: round(s.areaMm2), cost: round(s.cost) };
}

export function boardUsage(flat: FlatNetlist, instances: readonly string[], family: MapFamily, accepted: Edit[]): { before: Usage; afterAccepted: Usage } {
  const devices = flat.devices.filter((d) => inBoard(instances, pathOf(d)));
  const before = usageOf(devices, family);
  const byName = new Map(flat.devices.map((d) => [d.name, d]));
  const after = { ...before };
  for (const edit of accepted) {
    const removed = edit.removeDevices.map((n) => byName.get(n)).filter((d): d is NonNullable<typeof d> => !!d && inBoard(instances, pathOf(d)));
    const added = edit.addDevices.filter((d) => (d.path && d.path.length ? inBoard(instances, d.path.join('.')) : removed.length > 0 || instances.length === 0));
    const r = usageOf(removed, family);
    const a = usageOf(added, family);
    after.parts += a.parts - r.parts;
    after.areaMm2 = round(after.areaMm2 + a.areaMm2 - r.areaMm2);
    after.cost = round(after.cost + a.cost - r.cost);
  }
  return { before, afterAccepted: after };
}

/** Boards (id → prefixes) a proposal's devices fall on. */
export function boardsTouched(boards: { id: string; instances: string[] }[], devicePaths: string[]): string[] {
  return boards.filter((b) => devicePaths.some((p) => inBoard(b.instances, p))).map((b) => b.id);
}
