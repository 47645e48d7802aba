// The text alternative of a drawing: every part with its kind, what the change does to it and its
// connections, then every net with what it joins — readable by a screen reader, row by row.
import { View } from 'react-native';
import { DataTable, Text } from '@/components/ui';
import { useTheme } from '@/components/theme/use-theme';
import type { PartRole, RegionGraph, RegionPart } from '@/optimizer/region/graph';

export const ROLE_WORDS: Record<PartRole, string> = {
  removed: 'removed',
  added: 'added',
  changed: 'rewired',
  neighbour: 'neighbour',
  plain: '',
};

export function kindWords(p: Pick<RegionPart, 'kind' | 'op'>): string {
  if (p.kind === 'gate') return `${(p.op ?? 'buf').toUpperCase()} gate`;
  return { npn: 'NPN transistor', pnp: 'PNP transistor', nmos: 'NMOS transistor', pmos: 'PMOS transistor', resistor: 'resistor', capacitor: 'capacitor', diode: 'diode', vsource: 'voltage source', isource: 'current source' }[p.kind];
}

/** One-sentence summary used as the drawing's accessibility label. */
export function graphSummary(title: string, g: RegionGraph): string {
  const count = (r: PartRole) => g.parts.filter((p) => p.role === r).length;
  const bits = [`${g.parts.length} parts`, `${g.nets.length} nets`];
  if (count('removed')) bits.push(`${count('removed')} removed`);
  if (count('added')) bits.push(`${count('added')} added`);
  if (count('changed')) bits.push(`${count('changed')} rewired`);
  return `${title}: ${bits.join(', ')}`;
}

export function PartsTable({ graph, testID, title }: { graph: RegionGraph; testID: string; title: string }) {
  const { spacing } = useTheme();
  const readers = new Map<string, string[]>();
  for (const p of graph.parts) for (const t of p.terminals) readers.set(t.net, [...(readers.get(t.net) ?? []), `${p.name}.${t.name}`]);
  return (
    <View style={{ gap: spacing.sm }}>
      <Text variant="label" tone="muted">{`${title} — parts`}</Text>
      <DataTable
        testID={`${testID}-parts`}
        caption={`${title}, parts`}
        columns={[{ title: 'Part', weight: 2 }, { title: 'Kind', weight: 2 }, { title: 'Change', weight: 1 }, { title: 'Connections', weight: 4 }]}
        rows={graph.parts.map((p) => [p.name, kindWords(p), ROLE_WORDS[p.role], p.terminals.map((t) => `${t.name}→${t.net}`).join(', ')])}
      />
      <Text variant="label" tone="muted">{`${title} — nets`}</Text>
      <DataTable
        testID={`${testID}-nets`}
        caption={`${title}, nets`}
        columns={[{ title: 'Net', weight: 2 }, { title: 'Kind', weight: 1 }, { title: 'Joins', weight: 5 }]}
        rows={graph.nets.map((n) => [n.name, n.railVolts !== undefined ? (n.railVolts === 0 ? 'ground' : `rail ${n.railVolts} V`) : n.boundary ? 'to the rest' : 'inside', (readers.get(n.name) ?? []).join(', ')])}
      />
    </View>
  );
}
