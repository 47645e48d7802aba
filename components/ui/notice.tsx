// An inline message: a confirmation after an action, or a caution the person should read.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Icon } from './icon';
import { Text } from './text';

export function Notice({ tone, message, testID }: { tone: 'success' | 'warning' | 'info'; message: string; testID?: string }) {
  const { colours, spacing, radii, sizes } = useTheme();
  const look = {
    success: { bg: colours.successSoft, fg: colours.success, icon: 'check' as const },
    warning: { bg: colours.warningSoft, fg: colours.warning, icon: 'alert' as const },
    info: { bg: colours.accentSoft, fg: colours.accent, icon: 'mail' as const },
  }[tone];
  return (
    <View testID={testID} accessibilityRole={tone === 'info' ? 'text' : 'alert'} style={{ flexDirection: 'row', gap: spacing.sm, backgroundColor: look.bg, borderRadius: radii.md, padding: spacing.md, alignItems: 'flex-start' }}>
      <Icon name={look.icon} colour={look.fg} size={sizes.iconSmall} />
      <Text style={{ color: look.fg, flexShrink: 1 }}>{message}</Text>
    </View>
  );
}
