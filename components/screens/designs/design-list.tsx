// The team's designs as a list: name, family, latest revision and parts, open proposals.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Card, ListRow } from '@/components/ui';
import { formatDate } from '@/components/screens/common/format';
import type { DesignListItem } from '@/shared/api/designs';
import { FAMILY_WORDS } from './family-words';

export function DesignList({ designs, selected, onSelect }: { designs: readonly DesignListItem[]; selected: string | null; onSelect: (id: string) => void }) {
  const { spacing } = useTheme();
  return (
    <Card padded={false} testID="design-list">
      <View>
        {designs.map((d, i) => (
          <ListRow
            key={d.id}
            testID={`design-row-${i}`}
            title={d.name}
            subtitle={`${FAMILY_WORDS[d.family]} · revision ${d.latestRevision.number} · ${d.latestRevision.partCounts.total} parts · ${d.boards} board${d.boards === 1 ? '' : 's'}`}
            meta={formatDate(d.updatedAt)}
            trailing={d.openProposals > 0 ? <Badge label={`${d.openProposals} open`} tone="accent" /> : <View style={{ width: spacing.none }} />}
            selected={selected === d.id}
            onPress={() => onSelect(d.id)}
            accessibilityLabel={`${d.name}, ${d.openProposals} open proposals`}
            last={i === designs.length - 1}
          />
        ))}
      </View>
    </Card>
  );
}
