// A design at a glance: part totals, the scan (start, live progress, cancel), the accepted
// proposals to apply, board budgets, operating assumptions and recent revisions.
import { View } from 'react-native';
import { useRouter } from 'expo-router';
import { useDesign } from '@/components/data/use-designs';
import { useMe } from '@/components/data/use-me';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, ErrorState, Loading, Text } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import { DesignCharts } from '@/components/charts/design-charts';
import { ApplyCard } from './apply-card';
import { AssumptionsCard } from './assumptions-card';
import { BoardBudgets } from './board-budgets';
import { FAMILY_WORDS } from './family-words';
import { PartTotals } from './part-totals';
import { RevisionsCard } from './revisions-card';
import { ScanCard } from './scan-card';

export function DesignOverview({ id }: { id: string }) {
  const router = useRouter();
  const { spacing } = useTheme();
  const { me } = useMe();
  const { design, error, isLoading, retry } = useDesign(id);
  if (error) return <ErrorState error={error} onRetry={retry} testID="design-error" />;
  if (isLoading || !design || !me) return <Loading label="Loading the design…" testID="design-loading" />;
  const latest = design.revisions[design.revisions.length - 1];
  const canChange = me.role === 'designer' || me.role === 'admin';
  const openProposals = `/designs/${design.id}/proposals` as const;
  return (
    <View testID="design-overview" style={{ gap: spacing.lg }}>
      <Card>
        <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
          <Text variant="headline" testID="design-name">
            {design.name}
          </Text>
          <Badge label={FAMILY_WORDS[design.family]} tone="accent" />
        </View>
        <Text variant="caption" tone="muted">
          Revision {latest?.number ?? '–'} of {design.revisions.length} · by {design.createdBy}
          {latest ? ` · ${formatDateTime(latest.createdAt)}` : ''}
          {design.clockPeriodNs ? ` · clock period ${design.clockPeriodNs} ns` : ''}
        </Text>
        {latest ? <PartTotals counts={latest.partCounts} delta={latest.number > 1 ? latest.delta : undefined} testID="design-totals" /> : null}
        <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.sm }}>
          <Button label="Proposals" icon="forward" variant="secondary" compact onPress={() => router.push(openProposals)} testID="design-open-proposals" accessibilityLabel={`Proposals of ${design.name}`} />
          <Button label="Revisions and exports" icon="history" variant="secondary" compact onPress={() => router.push(`/designs/${design.id}/revisions`)} testID="design-open-revisions" accessibilityLabel={`Revisions and exports of ${design.name}`} />
          <Button label="Trade-off explorer" icon="lessons" variant="secondary" compact onPress={() => router.push(`/designs/${design.id}/explorer`)} testID="design-open-explorer" accessibilityLabel={`Trade-off explorer of ${design.name}`} />
        </View>
      </Card>
      <ScanCard design={design} canScan={canChange} onOpenProposals={() => router.push(openProposals)} />
      {canChange ? <ApplyCard design={design} /> : null}
      <BoardBudgets boards={design.boards} />
      <DesignCharts design={design} />
      <AssumptionsCard designId={design.id} assumptions={design.assumptions} canEdit={canChange} />
      <RevisionsCard revisions={design.revisions} limit={3} />
    </View>
  );
}
