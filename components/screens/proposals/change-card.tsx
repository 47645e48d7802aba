// What a proposal changes and where: the devices, instances and nets it touches, the edit as
// data (devices removed and added, terminals moved, nets merged) and the part change by kind.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Card, DataTable, Text } from '@/components/ui';
import type { ProposalDetail } from '@/shared/api/proposals';
import { signed } from './labels';

function Names({ label, names, testID }: { label: string; names: readonly string[]; testID: string }) {
  const { colours, spacing, radii } = useTheme();
  // The engine may name a net once per device touching it; each name is shown once.
  const unique = [...new Set(names)];
  if (unique.length === 0) return null;
  const shown = unique.slice(0, 24);
  return (
    <View style={{ gap: spacing.xs }} testID={testID}>
      <Text variant="overline" tone="muted">
        {label} ({unique.length})
      </Text>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.xs }}>
        {shown.map((n) => (
          <View key={n} style={{ backgroundColor: colours.surfaceMuted, borderRadius: radii.sm, paddingHorizontal: spacing.sm, paddingVertical: spacing.xxs }}>
            <Text variant="mono">{n}</Text>
          </View>
        ))}
        {unique.length > shown.length ? (
          <Text variant="caption" tone="muted">
            and {unique.length - shown.length} more
          </Text>
        ) : null}
      </View>
    </View>
  );
}

function addedName(device: Record<string, unknown>): string {
  const name = device.name ?? device.id;
  const kind = device.kind;
  return `${typeof name === 'string' ? name : 'new'}${typeof kind === 'string' ? ` (${kind})` : ''}`;
}

export function ChangeCard({ proposal }: { proposal: ProposalDetail }) {
  const { spacing } = useTheme();
  const { location, edit, savings } = proposal;
  const kinds: [string, number][] = [
    ['Transistors', savings.transistors],
    ['Resistors', savings.resistors],
    ['Diodes', savings.diodes],
    ['Capacitors', savings.capacitors],
    ['Gates', savings.gates],
  ];
  const rows = kinds.filter(([, n]) => n !== 0).map(([k, n]) => [k, signed(-n)]);
  rows.push(['All parts', signed(-savings.parts)]);
  return (
    <Card title="What changes, and where" testID="proposal-change">
      <Text>{proposal.message}</Text>
      <Names label="Instances" names={location.instances} testID="proposal-instances" />
      <Names label="Devices" names={location.devices} testID="proposal-devices" />
      <Names label="Nets" names={location.nets} testID="proposal-nets" />
      <View style={{ gap: spacing.xs }}>
        <Text variant="overline" tone="muted">
          The rewrite
        </Text>
        <Text tone="muted" testID="proposal-edit-summary">
          Removes {edit.removeDevices.length} device{edit.removeDevices.length === 1 ? '' : 's'}, adds {edit.addDevices.length}, moves {edit.reconnect.length} terminal
          {edit.reconnect.length === 1 ? '' : 's'} and merges {edit.mergeNets.length} net{edit.mergeNets.length === 1 ? '' : 's'}.
        </Text>
        <Names label="Added" names={edit.addDevices.map(addedName)} testID="proposal-added" />
        <Names label="Merged nets" names={edit.mergeNets.map((m) => `${m.remove} → ${m.keep}`)} testID="proposal-merged" />
      </View>
      <View style={{ gap: spacing.xs }}>
        <Text variant="overline" tone="muted">
          Part change
        </Text>
        <DataTable
          testID="proposal-part-delta"
          caption="Part change by kind"
          columns={[{ title: 'Kind', weight: 2 }, { title: 'Change', numeric: true }]}
          rows={rows}
        />
        {savings.areaMm2 !== 0 || savings.cost !== 0 ? (
          <Text variant="caption" tone="muted">
            Board area saved {savings.areaMm2.toFixed(1)} mm², cost saved {savings.cost.toFixed(2)} (demo prices are invented).
          </Text>
        ) : null}
      </View>
    </Card>
  );
}
