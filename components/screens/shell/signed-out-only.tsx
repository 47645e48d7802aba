// Sign-in and the reset request are for signed-out people; signed-in people go to their first tab.
import type { ReactNode } from 'react';
import { Redirect } from 'expo-router';
import { useMe } from '@/components/data/use-me';
import { homeTabFor } from '@/components/navigation/role-tabs';
import { Loading, Screen } from '@/components/ui';

export function SignedOutOnly({ children }: { children: ReactNode }) {
  const { me, status } = useMe();
  if (me) return <Redirect href={`/${homeTabFor(me.role)}`} />;
  // While the session is being checked, show nothing that could flash a form at a signed-in person.
  if (status === 'loading') {
    return (
      <Screen testID="session-loading">
        <Loading label="Checking your session…" />
      </Screen>
    );
  }
  return <>{children}</>;
}
