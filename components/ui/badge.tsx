// A small label for a status or role.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type BadgeTone = 'neutral' | 'accent' | 'success' | 'warning' | 'danger';

export function Badge({ label, tone = 'neutral', testID }: { label: string; tone?: BadgeTone; testID?: string }) {
  const { colours, spacing, radii } = useTheme();
  const look = {
    neutral: { bg: colours.surfaceMuted, fg: colours.textMuted },
    accent: { bg: colours.accentSoft, fg: colours.accent },
    success: { bg: colours.successSoft, fg: colours.success },
    warning: { bg: colours.warningSoft, fg: colours.warning },
    danger: { bg: colours.dangerSoft, fg: colours.danger },
  }[tone];
  return (
    <View testID={testID} style={{ backgroundColor: look.bg, borderRadius: radii.pill, paddingHorizontal: spacing.sm, paddingVertical: spacing.xxs, alignSelf: 'flex-start' }}>
      <Text variant="caption" style={{ color: look.fg }}>
        {label}
      </Text>
    </View>
  );
}
