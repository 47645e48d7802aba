// The cautions every proposal and export carries (product brief §8): first-order margins,
// simulate and bench-test before building, data sheets for limits, local codes for mains work.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Icon, Text } from '@/components/ui';

export const STANDARD_CAUTIONS = [
  'The margins are first-order estimates. Before a rewrite goes on a board, simulate the exported deck and check it on the bench.',
  "Use the parts' data sheets for limits.",
  'Work on anything connected to mains, or anything safety-related, follows local codes and licensed practice.',
] as const;

export function Cautions({ extra = [], testID }: { extra?: readonly string[]; testID: string }) {
  const { colours, spacing, radii, sizes } = useTheme();
  // The server may send its own wording of the same cautions; show each sentence once.
  const lines = [...new Set([...extra, ...STANDARD_CAUTIONS])];
  return (
    <View testID={testID} accessibilityRole="alert" style={{ backgroundColor: colours.warningSoft, borderRadius: radii.md, padding: spacing.md, gap: spacing.xs }}>
      <View style={{ flexDirection: 'row', gap: spacing.sm, alignItems: 'center' }}>
        <Icon name="alert" colour={colours.warning} size={sizes.iconSmall} />
        <Text variant="label" tone="warning">
          Before you build
        </Text>
      </View>
      {lines.map((line) => (
        <Text key={line} variant="caption" tone="warning">
          {line}
        </Text>
      ))}
    </View>
  );
}
