// Account: profile, notification e-mails, teams and signing out.
import { useState } from 'react';
import { View } from 'react-native';
import { useRouter } from 'expo-router';
import { errorSentence } from '@/components/data/error-sentences';
import { useAccount } from '@/components/data/use-account';
import { useMe, useSessionActions } from '@/components/data/use-me';
import { roleLabel } from '@/components/navigation/role-labels';
import { useTheme } from '@/components/theme/use-theme';
import { Button, ErrorState, Loading, Notice, Screen } from '@/components/ui';
import { NotificationsCard } from './notifications-card';
import { ProfileCard } from './profile-card';
import { TeamsCard } from './teams-card';

export function AccountScreen() {
  const { me } = useMe();
  const { account, error, isLoading, retry } = useAccount();
  const { signOut } = useSessionActions();
  const router = useRouter();
  const { spacing } = useTheme();
  const [signingOut, setSigningOut] = useState(false);
  const [signOutError, setSignOutError] = useState<string | null>(null);

  async function doSignOut() {
    setSigningOut(true);
    setSignOutError(null);
    try {
      await signOut();
      router.replace('/sign-in');
    } catch (e) {
      setSignOutError(errorSentence(e));
      setSigningOut(false);
    }
  }

  const subtitle = me ? `${roleLabel(me.role)} in ${me.team.name}` : undefined;
  const signOutBlock = (
    <View style={{ gap: spacing.sm }}>
      {signOutError ? <Notice tone="warning" message={signOutError} /> : null}
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Sign out" icon="signOut" variant="secondary" onPress={doSignOut} busy={signingOut} testID="sign-out" />
      </View>
    </View>
  );

  if (error) {
    return (
      <Screen testID="account-screen" title="Account" subtitle={subtitle}>
        <ErrorState error={error} onRetry={retry} />
        {signOutBlock}
      </Screen>
    );
  }
  if (isLoading || !account || !me) {
    return (
      <Screen testID="account-screen" title="Account" subtitle={subtitle}>
        <Loading label="Loading your account…" />
      </Screen>
    );
  }
  return (
    <Screen testID="account-screen" title="Account" subtitle={subtitle}>
      <ProfileCard account={account} />
      <NotificationsCard account={account} />
      <TeamsCard me={me} />
      {signOutBlock}
    </Screen>
  );
}
