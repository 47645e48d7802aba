// A proposal's region before and after, side by side on wide windows and stacked on phones, with a
// legend for the highlight colours.
import { View } from 'react-native';
import { Text } from '@/components/ui';
import { useTheme } from '@/components/theme/use-theme';
import { useLayoutSize } from '@/components/theme/use-layout';
import type { RegionGraph } from '@/optimizer/region/graph';
import { SchematicView } from './schematic-view';

export function BeforeAfterDrawing({ before, after, testID = 'region-drawing', note }: { before: RegionGraph; after: RegionGraph; testID?: string; note?: string }) {
  const { colours, spacing, radii, sizes } = useTheme();
  const wide = useLayoutSize() === 'wide';
  const swatch = (colour: string, words: string) => (
    <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.xs }}>
      <View style={{ width: spacing.md, height: spacing.md, borderRadius: radii.sm, borderWidth: sizes.hairline, borderColor: colour }} />
      <Text variant="caption" tone="muted">{words}</Text>
    </View>
  );
  return (
    <View testID={testID} style={{ gap: spacing.md }}>
      <View style={{ flexDirection: 'row', gap: spacing.lg, flexWrap: 'wrap' }} accessibilityLabel="Legend: red marks removed parts, green added parts, amber rewired parts">
        {swatch(colours.danger, 'removed')}
        {swatch(colours.success, 'added')}
        {swatch(colours.warning, 'rewired')}
        {swatch(colours.accent, 'net to the rest of the design')}
      </View>
      <View style={{ flexDirection: wide ? 'row' : 'column', gap: spacing.lg }}>
        <SchematicView graph={before} title="Before" testID={`${testID}-before`} />
        <SchematicView graph={after} title="After" testID={`${testID}-after`} />
      </View>
      {note ? <Text variant="caption" tone="muted">{note}</Text> : null}
    </View>
  );
}
