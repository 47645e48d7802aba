// The design's revisions, newest first: who made each and how, and its part change against the
// one before. Each can be chosen for export.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Card, ListRow, Text } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import { signed } from '@/components/screens/proposals/labels';
import type { Revision } from '@/shared/api/revisions';

export function deltaPhrase(r: Revision): string {
  if (r.number === 1) return 'first upload';
  const kinds: [keyof Revision['delta'], string][] = [
    ['transistors', 'transistors'],
    ['resistors', 'resistors'],
    ['diodes', 'diodes'],
    ['capacitors', 'capacitors'],
    ['gates', 'gates'],
  ];
  const changed = kinds.filter(([k]) => r.delta[k] !== 0).map(([k, w]) => `${signed(r.delta[k])} ${w}`);
  return changed.length ? changed.join(', ') : 'no part change';
}

export function RevisionsCard({ revisions, selected, onSelect, limit }: { revisions: readonly Revision[]; selected?: number; onSelect?: (n: number) => void; limit?: number }) {
  const { spacing } = useTheme();
  const newest = [...revisions].sort((a, b) => b.number - a.number);
  const shown = limit ? newest.slice(0, limit) : newest;
  return (
    <Card title="Revisions" padded={false} testID="design-revisions">
      <View>
        {shown.map((r, i) => (
          <ListRow
            key={r.id}
            testID={`revision-${r.number}`}
            title={`Revision ${r.number} · ${r.partCounts.total} parts`}
            subtitle={`${r.appliedProposals.length ? `${r.appliedProposals.length} proposal${r.appliedProposals.length === 1 ? '' : 's'} applied` : `Uploaded ${r.format}`} · ${deltaPhrase(r)} · ${r.createdBy}`}
            meta={formatDateTime(r.createdAt)}
            trailing={r.delta.total < 0 ? <Badge label={signed(r.delta.total)} tone="success" /> : r.delta.total > 0 ? <Badge label={signed(r.delta.total)} tone="warning" /> : undefined}
            selected={selected === r.number}
            onPress={onSelect ? () => onSelect(r.number) : undefined}
            accessibilityLabel={`Revision ${r.number}, ${deltaPhrase(r)}`}
            last={i === shown.length - 1}
          />
        ))}
      </View>
      {limit && newest.length > limit ? (
        <Text variant="caption" tone="muted" style={{ paddingHorizontal: spacing.lg, paddingBottom: spacing.md }}>
          {newest.length - limit} older revision{newest.length - limit === 1 ? '' : 's'} in the history.
        </Text>
      ) : null}
    </Card>
  );
}
