// Renders lesson notes from parsed Markdown as text nodes only — no HTML is ever injected, so a
// note containing markup shows that markup as text.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from '@/components/ui';
import { parseMarkdown, type Inline } from './markdown-parse';

function Runs({ inline }: { inline: Inline[] }) {
  const { fonts, colours } = useTheme();
  return (
    <>
      {inline.map((r, i) => {
        if (r.kind === 'strong') return <Text key={i} style={{ fontFamily: fonts.semibold }}>{r.text}</Text>;
        if (r.kind === 'em') return <Text key={i} style={{ fontStyle: 'italic' }}>{r.text}</Text>;
        if (r.kind === 'code') return <Text key={i} style={{ fontFamily: fonts.mono, backgroundColor: colours.surfaceMuted }}>{r.text}</Text>;
        return <Text key={i}>{r.text}</Text>;
      })}
    </>
  );
}

export function MarkdownView({ source, testID }: { source: string; testID?: string }) {
  const { spacing, colours, radii } = useTheme();
  const blocks = parseMarkdown(source);
  return (
    <View testID={testID} style={{ gap: spacing.sm }}>
      {blocks.map((b, i) => {
        if (b.kind === 'heading')
          return (
            <Text key={i} variant={b.level === 1 ? 'title' : 'bodyStrong'} accessibilityRole="header">
              <Runs inline={b.inline} />
            </Text>
          );
        if (b.kind === 'code')
          return (
            <View key={i} style={{ backgroundColor: colours.surfaceMuted, borderRadius: radii.sm, padding: spacing.sm }}>
              <Text variant="mono">{b.text}</Text>
            </View>
          );
        if (b.kind === 'list')
          return (
            <View key={i} style={{ gap: spacing.xxs }}>
              {b.items.map((item, j) => (
                <View key={j} style={{ flexDirection: 'row', gap: spacing.sm }}>
                  <Text tone="muted">{b.ordered ? `${j + 1}.` : '•'}</Text>
                  <Text style={{ flex: 1 }}>
                    <Runs inline={item} />
                  </Text>
                </View>
              ))}
            </View>
          );
        return (
          <Text key={i}>
            <Runs inline={b.inline} />
          </Text>
        );
      })}
    </View>
  );
}
