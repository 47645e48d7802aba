// Joins the role's tab list with the navigator's state so both tab bar forms render the same items.
import type { BottomTabBarProps } from 'expo-router/tabs';
import type { Role } from '@/components/data/types';
import { PARENT_TAB, tabsForRole, type TabSpec } from './role-tabs';

export type NavItem = TabSpec & { focused: boolean; onPress: () => void };

export function navItems({ state, navigation }: Pick<BottomTabBarProps, 'state' | 'navigation'>, role: Role): NavItem[] {
  const routeName = state.routes[state.index]?.name;
  const focusedName = (routeName && PARENT_TAB[routeName]) || routeName;
  return tabsForRole(role).flatMap((tab) => {
    const route = state.routes.find((r) => r.name === tab.id);
    if (!route) return [];
    const focused = focusedName === tab.id;
    return [
      {
        ...tab,
        focused,
        onPress: () => {
          const event = navigation.emit({ type: 'tabPress', target: route.key, canPreventDefault: true });
          // A route inside the tab (focused, but not the tab itself) goes back to the tab.
          if (routeName !== route.name && !event.defaultPrevented) navigation.navigate(route.name, route.params);
        },
      },
    ];
  });
}
