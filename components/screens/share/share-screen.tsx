// /share/:token — a shared lesson, read-only, signed out or in: its notes and the trade-off
// explorer. A revoked, expired or unknown link shows one and the same sentence.
import { useLocalSearchParams } from 'expo-router';
import { View } from 'react-native';
import { useSharedLesson } from '@/components/data/use-lessons';
import { useTheme } from '@/components/theme/use-theme';
import { EmptyState, Loading, Notice, Screen } from '@/components/ui';
import { formatDate } from '@/components/screens/common/format';
import { LessonReading } from '@/components/screens/lessons/lesson-reading';
import { PrintButton } from '@/components/screens/lessons/print-button';

export function ShareScreen() {
  const { spacing } = useTheme();
  const { token } = useLocalSearchParams<{ token: string }>();
  const { shared, error, isLoading } = useSharedLesson(token ?? null);
  if (error)
    return (
      <Screen testID="share-screen">
        <EmptyState icon="alert" title="This link does not work" body="It may have been revoked or have expired, or it is for team members only: ask the person who sent it." testID="share-gone" />
      </Screen>
    );
  if (isLoading || !shared)
    return (
      <Screen testID="share-screen">
        <Loading label="Opening the lesson…" testID="share-loading" />
      </Screen>
    );
  const { lesson, explorer } = shared;
  return (
    <Screen
      testID="share-screen"
      title={lesson.title}
      subtitle={`${explorer.design.name} · revision ${explorer.design.revision}${lesson.author ? ` · by ${lesson.author}` : ''}${lesson.publishedAt ? ` · ${formatDate(lesson.publishedAt)}` : ''}`}
      width="full"
      headerAccessory={<PrintButton testID="share-print" />}
    >
      <View style={{ gap: spacing.lg }}>
        <Notice tone="info" message="A shared lesson: read-only. Sign-in is not needed to explore it." testID="share-readonly" />
        <LessonReading sections={lesson.sections} explorer={explorer} />
      </View>
    </Screen>
  );
}
