// Starts a lesson: a title and a design (its latest revision); every proposal of that revision is
// chosen to begin with, and the editor narrows the set.
import { useState } from 'react';
import { View } from 'react-native';
import { useDesigns } from '@/components/data/use-designs';
import { useLessonActions } from '@/components/data/use-lessons';
import { useProposals } from '@/components/data/use-proposals';
import { errorSentence } from '@/components/data/error-sentences';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, ChoiceChips, Notice, Text, TextField } from '@/components/ui';

export function LessonCreateForm({ onCreated, onCancel }: { onCreated: (id: string) => void; onCancel: () => void }) {
  const { spacing } = useTheme();
  const { designs } = useDesigns();
  const { create } = useLessonActions();
  const [title, setTitle] = useState('');
  const [designId, setDesignId] = useState<string>('');
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const chosen = designs?.find((d) => d.id === designId);
  const { proposals } = useProposals(designId || null);
  const ofRevision = (proposals ?? []).filter((p) => p.revision === chosen?.latestRevision.number);

  const submit = async () => {
    if (!title.trim() || !chosen) {
      setProblem('Give the lesson a title and pick a design.');
      return;
    }
    setBusy(true);
    setProblem(null);
    try {
      const made = await create({
        title: title.trim(),
        designId: chosen.id,
        revision: chosen.latestRevision.number,
        proposalIds: ofRevision.map((p) => p.id),
        sections: [{ heading: 'What to look for', body: `Switch each rewrite of **${chosen.name}** on and off and watch the margins.` }],
      });
      onCreated(made.id);
    } catch (err) {
      setProblem(errorSentence(err));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="New lesson" description="Built from the latest revision of a design; you choose its proposals next." testID="lesson-create">
      <View style={{ gap: spacing.md }}>
        <TextField label="Title" value={title} onChangeText={setTitle} testID="lesson-create-title" placeholder="e.g. What a shared pull-up costs" />
        {designs && designs.length > 0 ? (
          <ChoiceChips label="Design" choices={designs.map((d) => ({ value: d.id, label: `${d.name} · r${d.latestRevision.number}` }))} value={designId} onChange={setDesignId} testID="lesson-create-design" />
        ) : (
          <Text tone="muted">No designs in this team yet.</Text>
        )}
        {chosen && (
          <Text variant="caption" tone="muted" testID="lesson-create-count">
            {ofRevision.length} proposal(s) of revision {chosen.latestRevision.number} will be chosen.
          </Text>
        )}
        {problem && <Notice tone="warning" message={problem} testID="lesson-create-problem" />}
        <View style={{ flexDirection: 'row', gap: spacing.sm }}>
          <Button label="Create draft" icon="plus" onPress={submit} busy={busy} testID="lesson-create-submit" />
          <Button label="Cancel" variant="ghost" onPress={onCancel} testID="lesson-create-cancel" />
        </View>
      </View>
    </Card>
  );
}
