// /designs/:id/explorer — the trade-off explorer on a design's latest revision, for its team:
// every proposal of that revision, recomputed in the browser; the stored design never changes.
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { useExplorer } from '@/components/data/use-lessons';
import { useTheme } from '@/components/theme/use-theme';
import { Button, ErrorState, Loading, Screen } from '@/components/ui';
import { TradeOffExplorer } from './trade-off-explorer';

export function DesignExplorerScreen() {
  const { spacing } = useTheme();
  const router = useRouter();
  const { id } = useLocalSearchParams<{ id: string }>();
  const { explorer, error, isLoading, retry } = useExplorer(id ? { designId: id } : null);
  let body: React.ReactNode;
  if (error) body = <ErrorState error={error} onRetry={retry} testID="design-explorer-error" />;
  else if (isLoading || !explorer) body = <Loading label="Loading the explorer…" testID="design-explorer-loading" />;
  else body = <TradeOffExplorer explorer={explorer} />;
  return (
    <Screen testID="design-explorer-screen" title="Trade-offs" subtitle={explorer ? `${explorer.design.name} · revision ${explorer.design.revision}` : undefined} width="full">
      <View style={{ gap: spacing.lg }}>
        <View style={{ alignSelf: 'flex-start' }}>
          <Button label="Design" icon="back" variant="ghost" compact onPress={() => router.navigate(`/designs/${id}`)} testID="design-explorer-back" />
        </View>
        {body}
      </View>
    </Screen>
  );
}
