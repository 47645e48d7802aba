// Side rail for wide windows: product mark, the role's tabs with a line on what each holds, and
// who is signed in to which team.
import { Pressable, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Badge } from '@/components/ui/badge';
import { Icon } from '@/components/ui/icon';
import { Text } from '@/components/ui/text';
import type { Me } from '@/components/data/types';
import { roleLabel } from './role-labels';
import type { NavItem } from './nav-items';
import { TAB_ICONS } from './tab-icons';

export function SideRail({ items, me }: { items: NavItem[]; me: Me }) {
  const { colours, spacing, sizes, radii } = useTheme();
  return (
    <View
      testID="side-rail"
      accessibilityRole="tablist"
      style={{ width: sizes.rail, backgroundColor: colours.surface, borderRightWidth: sizes.hairline, borderRightColor: colours.border, paddingVertical: spacing.lg, paddingHorizontal: spacing.md, gap: spacing.xl }}
    >
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, paddingHorizontal: spacing.sm }}>
        <View style={{ width: sizes.brandMark, height: sizes.brandMark, borderRadius: radii.md, backgroundColor: colours.accent, alignItems: 'center', justifyContent: 'center' }}>
          <Icon name="mark" colour={colours.onAccent} size={sizes.iconSmall} />
        </View>
        <View>
          <Text variant="title">Trimwire</Text>
        </View>
      </View>
      <View style={{ gap: spacing.xxs, flex: 1 }}>
        {items.map((item) => (
          <Pressable
            key={item.id}
            testID={`tab-${item.id}`}
            accessibilityRole="tab"
            accessibilityLabel={item.title}
            accessibilityState={{ selected: item.focused }}
            onPress={item.onPress}
            style={({ pressed }) => ({
              flexDirection: 'row',
              alignItems: 'center',
              gap: spacing.md,
              paddingVertical: spacing.sm,
              paddingHorizontal: spacing.sm,
              borderRadius: radii.md,
              backgroundColor: item.focused ? colours.accentSoft : pressed ? colours.surfaceMuted : colours.transparent,
            })}
          >
            <Icon name={TAB_ICONS[item.id]} colour={item.focused ? colours.accent : colours.textMuted} />
            <View style={{ flex: 1 }}>
              <Text variant="bodyStrong" tone={item.focused ? 'accent' : 'default'}>
                {item.title}
              </Text>
              <Text variant="caption" tone="muted" numberOfLines={1}>
                {item.description}
              </Text>
            </View>
          </Pressable>
        ))}
      </View>
      <View testID="rail-identity" style={{ gap: spacing.xs, paddingHorizontal: spacing.sm, paddingTop: spacing.md, borderTopWidth: sizes.hairline, borderTopColor: colours.border }}>
        <Text variant="overline" tone="faint">
          {me.team.name}
        </Text>
        <Text variant="bodyStrong" numberOfLines={1}>
          {me.user.name || me.user.email}
        </Text>
        <Badge label={roleLabel(me.role)} tone="accent" />
      </View>
    </View>
  );
}
