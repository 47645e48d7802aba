// Keeps a person out of a tab their role does not include (a typed or old link): they are sent
// to their own first tab instead of seeing a screen whose calls would all be refused.
import type { ReactNode } from 'react';
import { Redirect } from 'expo-router';
import { useMe } from '@/components/data/use-me';
import { canOpenTab, homeTabFor, type TabId } from '@/components/navigation/role-tabs';

export function TabGuard({ tab, children }: { tab: TabId; children: ReactNode }) {
  const { me } = useMe();
  if (me && !canOpenTab(me.role, tab)) return <Redirect href={`/${homeTabFor(me.role)}`} />;
  return <>{children}</>;
}
