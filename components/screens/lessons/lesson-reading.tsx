// A lesson as readers see it: its notes (safe Markdown) then the trade-off explorer. Used in the
// lessons tab, on share links and (without the explorer) in the handout.
import { View } from 'react-native';
import type { Section } from '@/shared/api/lessons';
import type { ExplorerData } from '@/optimizer/whatif';
import { useTheme } from '@/components/theme/use-theme';
import { Card } from '@/components/ui';
import { MarkdownView } from './markdown-view';
import { TradeOffExplorer } from './trade-off-explorer';

export function LessonSections({ sections }: { sections: Section[] }) {
  const { spacing } = useTheme();
  return (
    <View style={{ gap: spacing.lg }} testID="lesson-sections">
      {sections.map((s, i) => (
        <Card key={s.id} title={s.heading} testID={`lesson-section-${i}`}>
          <MarkdownView source={s.body} />
        </Card>
      ))}
    </View>
  );
}

export function LessonReading({ sections, explorer }: { sections: Section[]; explorer?: ExplorerData }) {
  const { spacing } = useTheme();
  return (
    <View style={{ gap: spacing.lg }}>
      <LessonSections sections={sections} />
      {explorer && <TradeOffExplorer explorer={explorer} />}
    </View>
  );
}
