// The lesson's notes as sections: edit heading and Markdown body, add, remove, move up or down.
// Edits stay local until the editor saves them (sent whole; their order is the saved order).
import { View } from 'react-native';
import type { Section } from '@/shared/api/lessons';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Text, TextField } from '@/components/ui';

export type DraftSection = { id?: string; heading: string; body: string };

export function moveItem<T>(list: readonly T[], from: number, to: number): T[] {
  const next = [...list];
  if (from < 0 || from >= next.length || to < 0 || to >= next.length) return next;
  const [moved] = next.splice(from, 1);
  next.splice(to, 0, moved!);
  return next;
}

export function toDraft(sections: Section[]): DraftSection[] {
  return sections.map((s) => ({ id: s.id, heading: s.heading, body: s.body }));
}

export function SectionsEditor({ sections, onChange }: { sections: DraftSection[]; onChange: (next: DraftSection[]) => void }) {
  const { spacing, colours, sizes, radii } = useTheme();
  const edit = (i: number, patch: Partial<DraftSection>) => onChange(sections.map((s, j) => (j === i ? { ...s, ...patch } : s)));
  return (
    <View style={{ gap: spacing.md }} testID="sections-editor">
      {sections.map((s, i) => (
        <View key={s.id ?? `new-${i}`} testID={`section-edit-${i}`} style={{ gap: spacing.sm, padding: spacing.md, borderWidth: sizes.hairline, borderColor: colours.border, borderRadius: radii.md }}>
          <TextField label={`Section ${i + 1} heading`} value={s.heading} onChangeText={(heading) => edit(i, { heading })} testID={`section-heading-${i}`} />
          <TextField label="Notes (Markdown: # headings, - lists, **bold**, *emphasis*, `code`)" value={s.body} onChangeText={(body) => edit(i, { body })} multiline numberOfLines={5} testID={`section-body-${i}`} />
          <View style={{ flexDirection: 'row', gap: spacing.sm, flexWrap: 'wrap' }}>
            <Button label="Up" compact variant="secondary" disabled={i === 0} onPress={() => onChange(moveItem(sections, i, i - 1))} testID={`section-up-${i}`} accessibilityLabel={`Move section ${i + 1} up`} />
            <Button label="Down" compact variant="secondary" disabled={i === sections.length - 1} onPress={() => onChange(moveItem(sections, i, i + 1))} testID={`section-down-${i}`} accessibilityLabel={`Move section ${i + 1} down`} />
            <Button label="Remove" compact variant="ghost" onPress={() => onChange(sections.filter((_, j) => j !== i))} testID={`section-remove-${i}`} accessibilityLabel={`Remove section ${i + 1}`} />
          </View>
        </View>
      ))}
      {sections.length === 0 && <Text tone="muted">No sections yet.</Text>}
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Add a section" icon="plus" variant="secondary" compact onPress={() => onChange([...sections, { heading: 'New section', body: '' }])} testID="section-add" />
      </View>
    </View>
  );
}
