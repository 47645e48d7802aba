// Waits for the session before showing signed-in screens: error, then loading, then a redirect
// to sign-in when signed out, then the children with the signed-in person.
import type { ReactNode } from 'react';
import { Redirect } from 'expo-router';
import type { Me } from '@/components/data/types';
import { useMe } from '@/components/data/use-me';
import { ErrorState, Loading, Screen } from '@/components/ui';

export function SessionGate({ children }: { children: (me: Me) => ReactNode }) {
  const { me, status, error, retry } = useMe();
  if (status === 'error') {
    return (
      <Screen testID="session-error">
        <ErrorState error={error} onRetry={retry} />
      </Screen>
    );
  }
  if (status === 'loading') {
    return (
      <Screen testID="session-loading">
        <Loading label="Checking your session…" />
      </Screen>
    );
  }
  if (!me) return <Redirect href="/sign-in" />;
  return <>{children(me)}</>;
}
