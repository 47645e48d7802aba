// SWR settings shared by every data hook: the API client is the fetcher, client errors (4xx) are
// not retried, and a 401 anywhere re-checks the session so the app falls back to sign-in.
import type { ReactNode } from 'react';
import { SWRConfig, mutate } from 'swr';
import { api } from './api-client';
import { ApiError } from './api-error';
import { ME_KEY } from './keys';

export function DataProvider({ children }: { children: ReactNode }) {
  return (
    <SWRConfig
      value={{
        fetcher: (path: string) => api.get(path),
        shouldRetryOnError: (error: unknown) => !(error instanceof ApiError && error.status >= 400 && error.status < 500),
        onError: (error: unknown, key: string) => {
          if (error instanceof ApiError && error.status === 401 && key !== ME_KEY) void mutate(ME_KEY);
        },
      }}
    >
      {children}
    </SWRConfig>
  );
}
