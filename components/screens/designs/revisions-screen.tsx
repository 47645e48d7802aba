// A design's revision history with the exports of the chosen revision (latest by default): on
// wide windows the exports sit beside the history.
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { useDesign } from '@/components/data/use-designs';
import { useTheme } from '@/components/theme/use-theme';
import { useLayoutSize } from '@/components/theme/use-layout';
import { Button, Card, ErrorState, Loading, Screen } from '@/components/ui';
import { ExportsCard } from './exports-card';
import { PartTotals } from './part-totals';
import { RevisionsCard } from './revisions-card';

export function RevisionsScreen() {
  const router = useRouter();
  const { spacing, sizes } = useTheme();
  const wide = useLayoutSize() === 'wide';
  const params = useLocalSearchParams<{ id: string; rev?: string }>();
  const { design, error, isLoading, retry } = useDesign(params.id);
  const frame = (body: React.ReactNode) => (
    <Screen testID="revisions-screen" title="Revisions and exports" subtitle={design?.name} width="full">
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label={design?.name ?? 'Design'} icon="back" variant="ghost" compact onPress={() => router.navigate(`/designs/${params.id}`)} testID="revisions-back" accessibilityLabel="Back to the design" />
      </View>
      {body}
    </Screen>
  );
  if (error) return frame(<ErrorState error={error} onRetry={retry} testID="revisions-error" />);
  if (isLoading || !design) return frame(<Loading label="Loading revisions…" testID="revisions-loading" />);
  const latest = design.revisions[design.revisions.length - 1];
  const chosen = design.revisions.find((r) => String(r.number) === params.rev) ?? latest;
  const history = <RevisionsCard revisions={design.revisions} selected={chosen?.number} onSelect={(n) => router.setParams({ rev: String(n) })} />;
  const exports = chosen ? (
    <View style={{ gap: spacing.lg }}>
      <Card title={`Revision ${chosen.number}`} description={chosen.note ?? undefined} testID="revision-chosen">
        <PartTotals counts={chosen.partCounts} delta={chosen.number > 1 ? chosen.delta : undefined} testID="revision-totals" />
      </Card>
      <ExportsCard designId={design.id} designName={design.name} revision={chosen.number} />
    </View>
  ) : null;
  return frame(
    wide ? (
      <View style={{ flexDirection: 'row', gap: spacing.lg, alignItems: 'flex-start' }}>
        <View style={{ width: sizes.listPane }}>{history}</View>
        <View style={{ flex: 1, minWidth: 0 }}>{exports}</View>
      </View>
    ) : (
      <View style={{ gap: spacing.lg }}>
        {exports}
        {history}
      </View>
    ),
  );
}
