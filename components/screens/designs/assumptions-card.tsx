// The design's operating assumptions: expression, owner and justification; add, edit or withdraw
// (designers and admins). A parse failure points at its column. Editing or withdrawing one puts
// the proposals that relied on it out of date.
import { useState } from 'react';
import { View } from 'react-native';
import { useDesignActions } from '@/components/data/use-designs';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, EmptyState, Notice, Text, TextField } from '@/components/ui';
import type { Assumption } from '@/shared/api/assumptions';
import { assumptionProblem, caretLine, type LocatedProblem } from './assumption-error';

type Draft = { id: string | null; expression: string; justification: string };

function AssumptionForm({ draft, designId, onDone }: { draft: Draft; designId: string; onDone: (message: string) => void }) {
  const { spacing, colours, radii } = useTheme();
  const { addAssumption, changeAssumption } = useDesignActions();
  const [expression, setExpression] = useState(draft.expression);
  const [justification, setJustification] = useState(draft.justification);
  const [problem, setProblem] = useState<LocatedProblem | null>(null);
  const [busy, setBusy] = useState(false);

  async function save() {
    if (!expression.trim() || !justification.trim()) {
      setProblem({ message: 'Give both the expression and why it holds.', col: null });
      return;
    }
    setBusy(true);
    setProblem(null);
    try {
      const body = { expression: expression.trim(), justification: justification.trim() };
      if (draft.id) await changeAssumption(designId, draft.id, body);
      else await addAssumption(designId, body);
      onDone(draft.id ? 'Assumption changed. Proposals that relied on it are now out of date.' : 'Assumption added. Scan again to use it.');
    } catch (e) {
      setProblem(assumptionProblem(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <View style={{ gap: spacing.md }} testID="assumption-form">
      <TextField
        label="Expression"
        hint="Over net names, e.g. !(clr & load) — clear and load are never active together."
        testID="assumption-expression"
        value={expression}
        onChangeText={setExpression}
        autoCapitalize="none"
        autoCorrect={false}
      />
      {problem?.col != null ? (
        <View style={{ backgroundColor: colours.dangerSoft, borderRadius: radii.sm, padding: spacing.sm }} testID="assumption-caret">
          <Text variant="mono">{expression}</Text>
          <Text variant="mono" tone="danger">
            {caretLine(problem.col)}
          </Text>
        </View>
      ) : null}
      {problem ? (
        <Text variant="caption" tone="danger" testID="assumption-problem">
          {problem.message}
        </Text>
      ) : null}
      <TextField label="Why it holds" testID="assumption-justification" value={justification} onChangeText={setJustification} multiline />
      <View style={{ flexDirection: 'row', gap: spacing.sm }}>
        <Button label={draft.id ? 'Save change' : 'Add assumption'} onPress={() => void save()} busy={busy} testID="assumption-save" />
        <Button label="Cancel" variant="ghost" onPress={() => onDone('')} testID="assumption-cancel" />
      </View>
    </View>
  );
}

export function AssumptionsCard({ designId, assumptions, canEdit }: { designId: string; assumptions: readonly Assumption[]; canEdit: boolean }) {
  const { spacing, colours, sizes } = useTheme();
  const { changeAssumption } = useDesignActions();
  const [draft, setDraft] = useState<Draft | null>(null);
  const [note, setNote] = useState<{ tone: 'success' | 'warning'; message: string } | null>(null);
  const [busyId, setBusyId] = useState<string | null>(null);

  async function withdraw(a: Assumption) {
    setBusyId(a.id);
    setNote(null);
    try {
      await changeAssumption(designId, a.id, { status: 'withdrawn' });
      setNote({ tone: 'success', message: `Withdrawn. Proposals that relied on ${a.expression} are now out of date.` });
    } catch (e) {
      setNote({ tone: 'warning', message: assumptionProblem(e).message });
    } finally {
      setBusyId(null);
    }
  }

  const active = assumptions.filter((a) => a.status === 'active');
  const withdrawn = assumptions.filter((a) => a.status === 'withdrawn');
  return (
    <Card title="Operating assumptions" description="What the rest of the machine guarantees. Rewrites may rely on these; each proposal says which." testID="design-assumptions">
      {note?.message ? <Notice tone={note.tone} message={note.message} testID="assumption-note" /> : null}
      {assumptions.length === 0 && !draft ? (
        <EmptyState icon="check" title="No assumptions stated" body="Without assumptions every rewrite must hold for every input. Add one when the machine rules some inputs out." testID="design-assumptions-empty" />
      ) : null}
      {[...active, ...withdrawn].map((a, i) =>
        draft?.id === a.id ? (
          <AssumptionForm key={a.id} draft={draft} designId={designId} onDone={(m) => { setDraft(null); if (m) setNote({ tone: 'success', message: m }); }} />
        ) : (
          <View key={a.id} testID={`assumption-${i}`} style={{ gap: spacing.xs, paddingBottom: spacing.sm, borderBottomWidth: sizes.hairline, borderBottomColor: colours.border }}>
            <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
              <Text variant="mono" tone={a.status === 'withdrawn' ? 'faint' : 'default'}>
                {a.expression}
              </Text>
              {a.status === 'withdrawn' ? <Badge label="Withdrawn" /> : null}
            </View>
            <Text tone="muted">{a.justification}</Text>
            <Text variant="caption" tone="faint">
              Owner {a.owner}
            </Text>
            {canEdit && a.status === 'active' ? (
              <View style={{ flexDirection: 'row', gap: spacing.sm }}>
                <Button label="Edit" variant="ghost" compact onPress={() => setDraft({ id: a.id, expression: a.expression, justification: a.justification })} testID={`assumption-${i}-edit`} accessibilityLabel={`Edit assumption ${a.expression}`} />
                <Button label="Withdraw" variant="ghost" compact onPress={() => void withdraw(a)} busy={busyId === a.id} testID={`assumption-${i}-withdraw`} accessibilityLabel={`Withdraw assumption ${a.expression}`} />
              </View>
            ) : null}
          </View>
        ),
      )}
      {draft && draft.id === null ? (
        <AssumptionForm draft={draft} designId={designId} onDone={(m) => { setDraft(null); if (m) setNote({ tone: 'success', message: m }); }} />
      ) : canEdit && !draft ? (
        <View style={{ alignSelf: 'flex-start' }}>
          <Button label="Add an assumption" icon="plus" variant="secondary" compact onPress={() => setDraft({ id: null, expression: '', justification: '' })} testID="assumption-add" />
        </View>
      ) : null}
    </Card>
  );
}
