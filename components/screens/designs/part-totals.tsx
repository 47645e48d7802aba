// The part totals of a revision as a row of figures, with the change against the previous revision.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from '@/components/ui';
import type { PartCounts } from '@/shared/api/revisions';
import { signed } from '@/components/screens/proposals/labels';

const KINDS: readonly [keyof PartCounts, string][] = [
  ['transistors', 'Transistors'],
  ['resistors', 'Resistors'],
  ['diodes', 'Diodes'],
  ['capacitors', 'Capacitors'],
  ['gates', 'Gates'],
  ['total', 'All parts'],
];

export function PartTotals({ counts, delta, testID }: { counts: PartCounts; delta?: PartCounts; testID: string }) {
  const { colours, spacing, radii, sizes } = useTheme();
  return (
    <View testID={testID} style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.sm }}>
      {KINDS.filter(([k]) => k === 'total' || counts[k] > 0 || (delta && delta[k] !== 0)).map(([k, label]) => (
        <View
          key={k}
          testID={`${testID}-${k}`}
          style={{
            // A fixed basis lets three figures share a phone row; long captions wrap inside.
            flexBasis: sizes.controlCompact * 3,
            flexGrow: 1,
            padding: spacing.md,
            gap: spacing.xxs,
            borderRadius: radii.md,
            borderWidth: sizes.hairline,
            borderColor: k === 'total' ? colours.accent : colours.border,
            backgroundColor: k === 'total' ? colours.accentSoft : colours.surface,
          }}
        >
          <Text variant="overline" tone="muted">
            {label}
          </Text>
          <Text variant="headline" tone={k === 'total' ? 'accent' : 'default'}>
            {counts[k]}
          </Text>
          {delta && delta[k] !== 0 ? (
            <Text variant="caption" tone={delta[k] < 0 ? 'success' : 'warning'}>
              {signed(delta[k])} since the last revision
            </Text>
          ) : null}
        </View>
      ))}
    </View>
  );
}
