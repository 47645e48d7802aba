// Buttons in four weights. Every button needs a testID and gets an accessibility label.
import { ActivityIndicator, Pressable, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Icon, type IconName } from './icon';
import { Text } from './text';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost';

export type ButtonProps = {
  label: string;
  onPress: () => void;
  testID: string;
  accessibilityLabel?: string;
  variant?: ButtonVariant;
  icon?: IconName;
  disabled?: boolean;
  busy?: boolean;
  compact?: boolean;
};

export function Button({ label, onPress, testID, accessibilityLabel, variant = 'primary', icon, disabled, busy, compact }: ButtonProps) {
  const { colours, spacing, radii, sizes, opacity } = useTheme();
  const inactive = disabled || busy;
  const look = {
    primary: { bg: colours.accent, pressed: colours.accentPressed, fg: colours.onAccent, border: colours.accent },
    secondary: { bg: colours.surface, pressed: colours.surfaceMuted, fg: colours.text, border: colours.borderStrong },
    danger: { bg: colours.surface, pressed: colours.dangerSoft, fg: colours.danger, border: colours.danger },
    ghost: { bg: colours.transparent, pressed: colours.overlay, fg: colours.accent, border: colours.transparent },
  }[variant];
  return (
    <Pressable
      testID={testID}
      accessibilityRole="button"
      accessibilityLabel={accessibilityLabel ?? label}
      accessibilityState={{ disabled: !!inactive, busy: !!busy }}
      disabled={inactive}
      onPress={onPress}
      style={({ pressed }) => ({
        minHeight: compact ? sizes.controlCompact : sizes.control,
        paddingHorizontal: compact ? spacing.md : spacing.lg,
        borderRadius: radii.md,
        borderWidth: sizes.hairline,
        borderColor: look.border,
        backgroundColor: pressed ? look.pressed : look.bg,
        opacity: inactive ? opacity.disabled : 1,
        alignItems: 'center',
        justifyContent: 'center',
      })}
    >
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm }}>
        {busy ? <ActivityIndicator size="small" color={look.fg} /> : icon ? <Icon name={icon} colour={look.fg} size={sizes.iconSmall} /> : null}
        <Text variant={compact ? 'label' : 'bodyStrong'} style={{ color: look.fg }}>
          {label}
        </Text>
      </View>
    </Pressable>
  );
}
