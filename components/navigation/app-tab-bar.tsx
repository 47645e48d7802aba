// Picks the tab bar form for the window size: bottom tabs on phones, a side rail when wide.
import type { BottomTabBarProps } from 'expo-router/tabs';
import type { Me } from '@/components/data/types';
import { useLayoutSize } from '@/components/theme/use-layout';
import { navItems } from './nav-items';
import { PhoneTabBar } from './phone-tab-bar';
import { SideRail } from './side-rail';

export function AppTabBar({ me, ...props }: BottomTabBarProps & { me: Me }) {
  const size = useLayoutSize();
  const items = navItems(props, me.role);
  return size === 'wide' ? <SideRail items={items} me={me} /> : <PhoneTabBar items={items} />;
}
