// The educator's editor for one lesson: title, which proposals it shows, sections; save, publish or
// back to draft, duplicate, delete, handout, share links — then the explorer as students see it.
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { useRouter } from 'expo-router';
import type { Lesson } from '@/shared/api/lessons';
import { useExplorer, useLessonActions } from '@/components/data/use-lessons';
import { useProposals } from '@/components/data/use-proposals';
import { errorSentence } from '@/components/data/error-sentences';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, Loading, Notice, Text, TextField, ToggleRow } from '@/components/ui';
import { SectionsEditor, toDraft, type DraftSection } from './sections-editor';
import { ShareLinksCard } from './share-links-card';
import { TradeOffExplorer } from './trade-off-explorer';

export function LessonEditor({ lesson, onGone }: { lesson: Lesson; onGone: (nextId?: string) => void }) {
  const { spacing } = useTheme();
  const router = useRouter();
  const actions = useLessonActions();
  const { explorer, isLoading } = useExplorer({ lessonId: lesson.id });
  const { proposals } = useProposals(lesson.designId);
  const [title, setTitle] = useState(lesson.title);
  const [chosen, setChosen] = useState<string[]>(lesson.proposalIds);
  const [sections, setSections] = useState<DraftSection[]>(toDraft(lesson.sections));
  const [busy, setBusy] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'success' | 'warning'; text: string } | null>(null);

  // Another lesson chosen, or the server's copy changed after a save: start from it.
  useEffect(() => {
    setTitle(lesson.title);
    setChosen(lesson.proposalIds);
    setSections(toDraft(lesson.sections));
  }, [lesson]);

  const ofRevision = (proposals ?? []).filter((p) => p.revision === lesson.revision);
  const dirty = title !== lesson.title || JSON.stringify(chosen) !== JSON.stringify(lesson.proposalIds) || JSON.stringify(sections) !== JSON.stringify(toDraft(lesson.sections));

  const run = async (what: string, fn: () => Promise<unknown>, done: string) => {
    setBusy(what);
    setMessage(null);
    try {
      await fn();
      setMessage({ tone: 'success', text: done });
    } catch (err) {
      setMessage({ tone: 'warning', text: errorSentence(err) });
    } finally {
      setBusy(null);
    }
  };
  const save = () => actions.update(lesson.id, { title, proposalIds: chosen, sections });

  return (
    <View style={{ gap: spacing.lg }} testID="lesson-editor">
      <Card testID="lesson-editor-head">
        <View style={{ gap: spacing.md }}>
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
            <Badge label={lesson.status === 'published' ? 'Published' : 'Draft'} tone={lesson.status === 'published' ? 'success' : 'neutral'} testID="lesson-status" />
            <Text tone="muted">
              {lesson.designName} · revision {lesson.revision}
            </Text>
          </View>
          <TextField label="Title" value={title} onChangeText={setTitle} testID="lesson-title" />
          <View style={{ flexDirection: 'row', gap: spacing.sm, flexWrap: 'wrap' }}>
            <Button label="Save" icon="check" disabled={!dirty} busy={busy === 'save'} onPress={() => run('save', save, 'Saved.')} testID="lesson-save" />
            {lesson.status === 'draft' ? (
              <Button label="Publish" variant="secondary" busy={busy === 'publish'} onPress={() => run('publish', async () => { if (dirty) await save(); await actions.publish(lesson.id); }, 'Published: readers can open it now.')} testID="lesson-publish" />
            ) : (
              <Button label="Back to draft" variant="secondary" busy={busy === 'unpublish'} onPress={() => run('unpublish', () => actions.unpublish(lesson.id), 'Back to draft: share links stop working until it is published again.')} testID="lesson-unpublish" />
            )}
            <Button label="Duplicate" variant="secondary" busy={busy === 'duplicate'} onPress={() => run('duplicate', async () => onGone((await actions.duplicate(lesson.id)).id), 'Duplicated.')} testID="lesson-duplicate" />
            <Button label="Handout" variant="ghost" icon="download" onPress={() => router.push(`/handout/${lesson.id}`)} testID="lesson-handout" />
            <Button label="Delete" variant="danger" busy={busy === 'delete'} onPress={() => run('delete', async () => { await actions.remove(lesson.id); onGone(); }, 'Deleted.')} testID="lesson-delete" />
          </View>
          {message && <Notice tone={message.tone} message={message.text} testID="lesson-message" />}
        </View>
      </Card>
      <Card title="Proposals in this lesson" description={`From revision ${lesson.revision}; students can switch each on and off.`} testID="lesson-proposals">
        <View style={{ gap: spacing.md }}>
          {ofRevision.length === 0 && <Text tone="muted">This revision has no proposals.</Text>}
          {ofRevision.map((p, i) => (
            <ToggleRow key={p.id} label={p.title} description={p.ruleId} value={chosen.includes(p.id)} onChange={(on) => setChosen((c) => (on ? [...c, p.id] : c.filter((x) => x !== p.id)))} testID={`lesson-proposal-${i}`} />
          ))}
        </View>
      </Card>
      <Card title="Sections" description="Notes in Markdown; raw HTML shows as text." testID="lesson-sections-card">
        <SectionsEditor sections={sections} onChange={setSections} />
      </Card>
      <ShareLinksCard lessonId={lesson.id} published={lesson.status === 'published'} />
      <Text variant="title">As students see it</Text>
      {isLoading || !explorer ? <Loading label="Loading the explorer…" testID="explorer-loading" /> : <TradeOffExplorer explorer={explorer} key={JSON.stringify(lesson.proposalIds)} />}
    </View>
  );
}
