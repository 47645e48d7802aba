// The team's audit log (sign-ins, invites, role changes, removals), readable by admins.
import useSWR from 'swr';
import { AUDIT_KEY } from './keys';
import type { AuditView } from './types';

export function useAudit() {
  const { data, error, isLoading, mutate } = useSWR<AuditView>(AUDIT_KEY);
  return { audit: data, error: error as unknown, isLoading, retry: () => mutate() };
}
