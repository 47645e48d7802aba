// Bottom tab bar for phone-sized windows: one icon and short title per tab the role may open.
import { Pressable, View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { useTheme } from '@/components/theme/use-theme';
import { Icon } from '@/components/ui/icon';
import { Text } from '@/components/ui/text';
import type { NavItem } from './nav-items';
import { TAB_ICONS } from './tab-icons';

export function PhoneTabBar({ items }: { items: NavItem[] }) {
  const { colours, spacing, sizes } = useTheme();
  const insets = useSafeAreaInsets();
  return (
    <View
      testID="tab-bar"
      accessibilityRole="tablist"
      style={{
        flexDirection: 'row',
        backgroundColor: colours.surface,
        borderTopWidth: sizes.hairline,
        borderTopColor: colours.border,
        paddingBottom: insets.bottom,
      }}
    >
      {items.map((item) => {
        const tint = item.focused ? colours.accent : colours.textMuted;
        return (
          <Pressable
            key={item.id}
            testID={`tab-${item.id}`}
            accessibilityRole="tab"
            accessibilityLabel={item.title}
            accessibilityState={{ selected: item.focused }}
            onPress={item.onPress}
            style={{ flex: 1, height: sizes.tabBar, alignItems: 'center', justifyContent: 'center', gap: spacing.xxs }}
          >
            <Icon name={TAB_ICONS[item.id]} colour={tint} />
            <Text variant="caption" style={{ color: tint }}>
              {item.title}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}
