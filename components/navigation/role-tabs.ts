// Which tabs each role sees, in display order. The shell, the tab guards and the landing
// redirect all read this one table.
import type { Role } from '@/components/data/types';

export type TabId = 'bench' | 'sign-off' | 'lessons' | 'team' | 'account';

export type TabSpec = { id: TabId; title: string; description: string; roles: readonly Role[] };

export const TABS: readonly TabSpec[] = [
  { id: 'bench', title: 'Bench', description: 'Designs and scans', roles: ['designer', 'admin', 'reviewer', 'educator'] },
  { id: 'sign-off', title: 'Sign-off', description: 'Rewrites to decide', roles: ['reviewer', 'admin'] },
  { id: 'lessons', title: 'Lessons', description: 'Trade-offs to teach', roles: ['educator', 'designer', 'viewer', 'admin'] },
  { id: 'team', title: 'Team', description: 'People, mail, audit', roles: ['admin'] },
  { id: 'account', title: 'Account', description: 'Profile and teams', roles: ['admin', 'designer', 'reviewer', 'educator', 'viewer'] },
];

// Routes of the shell that are not tabs themselves, and the tab they belong to (kept lit while open).
export const PARENT_TAB: Readonly<Record<string, TabId>> = { designs: 'bench', 'proposals/[id]': 'bench' };

export function tabsForRole(role: Role): TabSpec[] {
  return TABS.filter((tab) => tab.roles.includes(role));
}

export function canOpenTab(role: Role, tab: TabId): boolean {
  return tabsForRole(role).some((t) => t.id === tab);
}

// Where a person lands after signing in: their first tab.
export function homeTabFor(role: Role): TabId {
  return tabsForRole(role)[0].id;
}
