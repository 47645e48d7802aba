// /handout/:id — a print-friendly page of a lesson: title, notes, the proposals with their part
// savings and margins as scanned, their charts and before/after drawings, the side-by-side views,
// and the cautions; no controls.
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { useExplorer, useLesson, useWhatIf } from '@/components/data/use-lessons';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, ErrorState, Loading, Screen, Text } from '@/components/ui';
import { ExplorerCharts, RegionPicture } from './explorer-pictures';
import { MarginsCard, PartsCard } from './explorer-results';
import { LessonSections } from './lesson-reading';
import { PrintButton } from './print-button';
import { TwoLevelSide } from './two-level-side';

const NO_SETTINGS = {};

export function HandoutScreen() {
  const { spacing } = useTheme();
  const router = useRouter();
  const { id } = useLocalSearchParams<{ id: string }>();
  const { lesson, error, isLoading, retry } = useLesson(id ?? null);
  const { explorer } = useExplorer(id ? { lessonId: id } : null);
  const { result } = useWhatIf(explorer, NO_SETTINGS, explorer?.proposals.map((p) => p.id) ?? []);
  if (error)
    return (
      <Screen testID="handout-screen">
        <ErrorState error={error} onRetry={retry} testID="handout-error" />
      </Screen>
    );
  if (isLoading || !lesson || !explorer)
    return (
      <Screen testID="handout-screen">
        <Loading label="Preparing the handout…" testID="handout-loading" />
      </Screen>
    );
  return (
    <Screen
      testID="handout-screen"
      title={lesson.title}
      subtitle={`${lesson.designName} · revision ${lesson.revision} · ${lesson.author}`}
      headerAccessory={
        <View style={{ flexDirection: 'row', gap: spacing.sm }}>
          <Button label="Back" icon="back" variant="ghost" compact onPress={() => router.navigate(`/lessons?lesson=${lesson.id}`)} testID="handout-back" />
          <PrintButton testID="handout-print" />
        </View>
      }
    >
      <View style={{ gap: spacing.lg }}>
        <LessonSections sections={lesson.sections} />
        <Text variant="title">All proposals switched on, at the scanned figures</Text>
        {result && <PartsCard result={result} explorer={explorer} />}
        {result && <MarginsCard result={result} explorer={explorer} />}
        {result && <ExplorerCharts explorer={explorer} result={result} testID="handout" />}
        {explorer.proposals.map((p, i) => (
          <Card key={p.id} title={p.title} description={`${p.ruleId} · the change, drawn`} testID={`handout-proposal-drawing-${i}`}>
            <RegionPicture proposals={[p]} testID={`handout-region-${i}`} empty="This rewrite removes or adds no parts to draw." />
          </Card>
        ))}
        {explorer.proposals.filter((p) => p.twoLevel).map((p, i) => (
          <TwoLevelSide key={p.id} view={p.twoLevel!} assumptions={p.evidence.assumptions} testID={`handout-two-level-${i}`} />
        ))}
        {explorer.cautions.map((c, i) => (
          <Text key={i} variant="caption" tone="muted">
            {c}
          </Text>
        ))}
      </View>
    </Screen>
  );
}
