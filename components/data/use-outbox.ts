// Mail captured by the local fake SMTP server (development and tests), readable by admins.
import useSWR from 'swr';
import { OUTBOX_KEY } from './keys';
import type { OutboxView } from './types';

export function useOutbox() {
  const { data, error, isLoading, mutate } = useSWR<OutboxView>(OUTBOX_KEY);
  return { outbox: data, error: error as unknown, isLoading, retry: () => mutate() };
}
