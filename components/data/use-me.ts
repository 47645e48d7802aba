// The signed-in person, their current team and role; plus the actions that change the session.
import useSWR, { useSWRConfig } from 'swr';
import { useCallback, useMemo } from 'react';
import { api } from './api-client';
import { ApiError } from './api-error';
import { ME_KEY } from './keys';
import type { Me } from './types';

async function fetchMe(path: string): Promise<Me | null> {
  try {
    return await api.get<Me>(path);
  } catch (error) {
    // Signed out is a normal state, not an error to show.
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export type SessionStatus = 'loading' | 'error' | 'signed-out' | 'signed-in';

export function useMe() {
  const { data, error, isLoading, mutate } = useSWR<Me | null>(ME_KEY, fetchMe);
  const status: SessionStatus = data ? 'signed-in' : data === null ? 'signed-out' : error ? 'error' : 'loading';
  return { me: data ?? null, status, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useSessionActions() {
  const { mutate } = useSWRConfig();

  // Another person's data must never survive a change of session: drop every cached key.
  const replaceSession = useCallback(
    async (me: Me | null) => {
      api.forgetCsrfToken();
      await mutate((key) => key !== ME_KEY, undefined, { revalidate: false });
      await mutate(ME_KEY, me, { revalidate: false });
    },
    [mutate],
  );

  return useMemo(
    () => ({
      signIn: async (email: string, password: string) => {
        const me = await api.post<Me>('/api/auth/sign-in', { email, password });
        await replaceSession(me);
        return me;
      },
      signOut: async () => {
        await api.post<void>('/api/auth/sign-out');
        await replaceSession(null);
      },
      switchTeam: async (teamId: string) => {
        const me = await api.post<Me>('/api/auth/switch-team', { teamId });
        await replaceSession(me);
        return me;
      },
      setPassword: async (token: string, password: string) => {
        const me = await api.post<Me>('/api/auth/set-password', { token, password });
        await replaceSession(me);
        return me;
      },
      requestPasswordReset: async (email: string) => {
        await api.post<void>('/api/auth/password-reset', { email });
      },
    }),
    [replaceSession],
  );
}
