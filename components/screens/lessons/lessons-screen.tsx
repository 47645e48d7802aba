// Lessons: the list (drafts and published for educators and admins, published for everyone else)
// and the chosen lesson beside it — the editor for those who may change it, the reading otherwise.
// The choice lives in the URL (?lesson=…).
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { View } from 'react-native';
import { useExplorer, useLesson, useLessons } from '@/components/data/use-lessons';
import { useMe } from '@/components/data/use-me';
import { TwoPane } from '@/components/navigation/two-pane';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, EmptyState, ErrorState, ListRow, Loading, Screen, Text } from '@/components/ui';
import { formatDate } from '@/components/screens/common/format';
import { LessonCreateForm } from './lesson-create-form';
import { LessonEditor } from './lesson-editor';
import { LessonReading } from './lesson-reading';

const WRITERS = new Set(['educator', 'admin']);

function LessonDetail({ id, canWrite, onGone }: { id: string; canWrite: boolean; onGone: (next?: string) => void }) {
  const { lesson, error, isLoading, retry } = useLesson(id);
  const { explorer } = useExplorer(!canWrite && lesson ? { lessonId: id } : null);
  if (error) return <ErrorState error={error} onRetry={retry} testID="lesson-error" />;
  if (isLoading || !lesson) return <Loading label="Loading the lesson…" testID="lesson-loading" />;
  if (canWrite) return <LessonEditor lesson={lesson} onGone={onGone} />;
  return (
    <View testID="lesson-reading">
      <Text variant="headline">{lesson.title}</Text>
      <Text tone="muted">
        {lesson.designName} · revision {lesson.revision} · by {lesson.author}
      </Text>
      <LessonReading sections={lesson.sections} explorer={explorer} />
    </View>
  );
}

export function LessonsScreen() {
  const router = useRouter();
  const { spacing } = useTheme();
  const { me } = useMe();
  const canWrite = WRITERS.has(me?.role ?? '');
  const params = useLocalSearchParams<{ lesson?: string }>();
  const selected = params.lesson || null;
  const { lessons, error, isLoading, retry } = useLessons();
  const [creating, setCreating] = useState(false);

  let list: React.ReactNode;
  if (error) list = <ErrorState error={error} onRetry={retry} testID="lessons-error" />;
  else if (isLoading || !lessons) list = <Loading label="Loading lessons…" testID="lessons-loading" />;
  else if (lessons.length === 0)
    list = (
      <EmptyState
        icon="lessons"
        title={canWrite ? 'No lessons yet' : 'No lessons shared with you yet'}
        body={canWrite ? 'Build one from a design and the proposals that show the trade-off you want to teach.' : 'Published lessons of your team appear here.'}
        testID="lessons-empty"
      />
    );
  else {
    const groups = canWrite ? (['draft', 'published'] as const) : (['published'] as const);
    list = (
      <View style={{ gap: spacing.md }}>
        {groups.map((status) => {
          const items = lessons.filter((l) => l.status === status);
          if (!items.length) return null;
          return (
            <Card key={status} title={status === 'draft' ? 'Drafts' : 'Published'} padded={false} testID={`lessons-${status}`}>
              {items.map((l, i) => (
                <ListRow
                  key={l.id}
                  title={l.title}
                  subtitle={`${l.designName} · r${l.revision} · ${l.proposalCount} proposal(s)`}
                  meta={`${l.author} · ${formatDate(l.updatedAt)}`}
                  trailing={<Badge label={status === 'draft' ? 'Draft' : 'Published'} tone={status === 'draft' ? 'neutral' : 'success'} />}
                  selected={l.id === selected}
                  onPress={() => router.setParams({ lesson: l.id })}
                  testID={`lesson-row-${l.id}`}
                  accessibilityLabel={`Open lesson ${l.title}`}
                  last={i === items.length - 1}
                />
              ))}
            </Card>
          );
        })}
      </View>
    );
  }

  const aside = canWrite ? (
    creating ? (
      <LessonCreateForm
        onCancel={() => setCreating(false)}
        onCreated={(id) => {
          setCreating(false);
          router.setParams({ lesson: id });
        }}
      />
    ) : (
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="New lesson" icon="plus" onPress={() => setCreating(true)} testID="lesson-new" />
      </View>
    )
  ) : undefined;

  return (
    <Screen testID="lessons-screen" title="Lessons" subtitle={canWrite ? 'Build trade-off lessons from your designs and share them read-only.' : 'Switch rewrites on and off and see what each costs and saves.'} width="full">
      <TwoPane
        testID="lessons"
        list={list}
        aside={aside}
        detail={selected ? <LessonDetail key={selected} id={selected} canWrite={canWrite} onGone={(next) => router.setParams({ lesson: next ?? '' })} /> : null}
        placeholder={<EmptyState icon="lessons" title="Pick a lesson" body={canWrite ? 'Or start a new one.' : 'Its notes and trade-off explorer open here.'} testID="lessons-placeholder" />}
        onBack={() => router.setParams({ lesson: '' })}
        backLabel="Lessons"
      />
    </Screen>
  );
}
