// The icon drawn for each tab, shared by the phone tab bar and the wide side rail.
import type { IconName } from '@/components/ui/icon';
import type { TabId } from './role-tabs';

export const TAB_ICONS: Record<TabId, IconName> = {
  bench: 'bench',
  'sign-off': 'signOff',
  lessons: 'lessons',
  team: 'team',
  account: 'account',
};
