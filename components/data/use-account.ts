// The signed-in person's own profile and notification preferences.
import useSWR, { useSWRConfig } from 'swr';
import { useMemo } from 'react';
import { api } from './api-client';
import { ACCOUNT_KEY, ME_KEY, TEAM_KEY } from './keys';
import type { AccountView, NotificationPrefs } from './types';

export function useAccount() {
  const { data, error, isLoading, mutate } = useSWR<AccountView>(ACCOUNT_KEY);
  return { account: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useAccountActions() {
  const { mutate } = useSWRConfig();
  return useMemo(
    () => ({
      update: async (change: { name?: string; notifications?: Partial<NotificationPrefs> }) => {
        const account = await api.patch<AccountView>('/api/account', change);
        await mutate(ACCOUNT_KEY, account, { revalidate: false });
        // The name also shows in the shell and the member list.
        await Promise.all([mutate(ME_KEY), mutate(TEAM_KEY)]);
        return account;
      },
    }),
    [mutate],
  );
}
