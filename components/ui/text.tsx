// Text in one of the theme's type variants and tones; the only way screens write words.
import { Text as RNText, type TextProps } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import type { TypeVariant } from '@/components/theme/tokens';

export type Tone = 'default' | 'muted' | 'faint' | 'accent' | 'danger' | 'success' | 'warning' | 'onAccent';

export function Text({ variant = 'body', tone = 'default', style, ...rest }: TextProps & { variant?: TypeVariant; tone?: Tone }) {
  const { colours, type } = useTheme();
  const colour = {
    default: colours.text,
    muted: colours.textMuted,
    faint: colours.textFaint,
    accent: colours.accent,
    danger: colours.danger,
    success: colours.success,
    warning: colours.warning,
    onAccent: colours.onAccent,
  }[tone];
  return <RNText {...rest} style={[type[variant], { color: colour }, variant === 'overline' && { textTransform: 'uppercase' }, style]} />;
}
