// A compact table of text cells with a header row: margins, counterexamples, part deltas.
// Columns share the width by weight; numeric columns are right-aligned and set in the mono face.
import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type Column = { title: string; weight?: number; numeric?: boolean };

export function DataTable({ columns, rows, testID, caption }: { columns: readonly Column[]; rows: readonly (readonly ReactNode[])[]; testID: string; caption?: string }) {
  const { colours, spacing, sizes, radii } = useTheme();
  const cell = (content: ReactNode, col: Column, header: boolean, key: number) => (
    <View key={key} style={{ flex: col.weight ?? 1, minWidth: 0, alignItems: col.numeric ? 'flex-end' : 'flex-start', justifyContent: 'center' }}>
      {typeof content === 'string' || typeof content === 'number' ? (
        <Text variant={header ? 'overline' : col.numeric ? 'mono' : 'body'} tone={header ? 'muted' : 'default'} style={{ textAlign: col.numeric ? 'right' : 'left' }}>
          {content}
        </Text>
      ) : (
        content
      )}
    </View>
  );
  return (
    <View testID={testID} accessibilityLabel={caption} style={{ borderWidth: sizes.hairline, borderColor: colours.border, borderRadius: radii.md, overflow: 'hidden' }}>
      <View style={{ flexDirection: 'row', gap: spacing.sm, paddingHorizontal: spacing.md, paddingVertical: spacing.sm, backgroundColor: colours.surfaceMuted }}>
        {columns.map((col, i) => cell(col.title, col, true, i))}
      </View>
      {rows.map((row, r) => (
        <View
          key={r}
          testID={`${testID}-row-${r}`}
          style={{ flexDirection: 'row', gap: spacing.sm, paddingHorizontal: spacing.md, paddingVertical: spacing.sm, borderTopWidth: sizes.hairline, borderTopColor: colours.border }}
        >
          {row.map((content, i) => cell(content, columns[i] ?? {}, false, i))}
        </View>
      ))}
    </View>
  );
}
