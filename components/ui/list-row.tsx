// One row of a list: title, secondary line, trailing accessory; pressable when given onPress.
import type { ReactNode } from 'react';
import { Pressable, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type ListRowProps = {
  title: string;
  subtitle?: string;
  meta?: string;
  trailing?: ReactNode;
  onPress?: () => void;
  selected?: boolean;
  testID: string;
  accessibilityLabel?: string;
  last?: boolean;
};

export function ListRow({ title, subtitle, meta, trailing, onPress, selected, testID, accessibilityLabel, last }: ListRowProps) {
  const { colours, spacing, sizes } = useTheme();
  const body = (pressed: boolean) => (
    <View
      style={{
        flexDirection: 'row',
        alignItems: 'center',
        gap: spacing.md,
        paddingVertical: spacing.md,
        paddingHorizontal: spacing.lg,
        backgroundColor: selected ? colours.accentSoft : pressed ? colours.surfaceMuted : colours.transparent,
        borderBottomWidth: last ? 0 : sizes.hairline,
        borderBottomColor: colours.border,
      }}
    >
      <View style={{ flex: 1, gap: spacing.xxs }}>
        <Text variant="bodyStrong" numberOfLines={1}>
          {title}
        </Text>
        {subtitle ? (
          <Text variant="caption" tone="muted" numberOfLines={1}>
            {subtitle}
          </Text>
        ) : null}
      </View>
      {meta ? (
        <Text variant="caption" tone="faint">
          {meta}
        </Text>
      ) : null}
      {trailing}
    </View>
  );
  if (!onPress) return <View testID={testID}>{body(false)}</View>;
  return (
    <Pressable testID={testID} accessibilityRole="button" accessibilityLabel={accessibilityLabel ?? title} accessibilityState={{ selected: !!selected }} onPress={onPress}>
      {({ pressed }) => body(pressed)}
    </Pressable>
  );
}
