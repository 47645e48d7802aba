// The current team's members and pending invites, and the admin actions that change them.
import useSWR, { useSWRConfig } from 'swr';
import { useMemo } from 'react';
import { api } from './api-client';
import { AUDIT_KEY, OUTBOX_KEY, TEAM_KEY } from './keys';
import type { Invite, Member, Role, TeamView } from './types';

export function useTeam() {
  const { data, error, isLoading, mutate } = useSWR<TeamView>(TEAM_KEY);
  return { team: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useTeamActions() {
  const { mutate } = useSWRConfig();
  return useMemo(() => {
    // Every team change writes mail and audit entries, so those views refresh with it.
    const refresh = async () => {
      await Promise.all([mutate(TEAM_KEY), mutate(OUTBOX_KEY), mutate(AUDIT_KEY)]);
    };
    return {
      invite: async (email: string, role: Role) => {
        const invite = await api.post<Invite>('/api/team/invites', { email, role });
        await refresh();
        return invite;
      },
      cancelInvite: async (id: string) => {
        await api.del(`/api/team/invites/${encodeURIComponent(id)}`);
        await refresh();
      },
      changeRole: async (userId: string, role: Role) => {
        const member = await api.patch<Member>(`/api/team/members/${encodeURIComponent(userId)}`, { role });
        await refresh();
        return member;
      },
      removeMember: async (userId: string) => {
        await api.del(`/api/team/members/${encodeURIComponent(userId)}`);
        await refresh();
      },
    };
  }, [mutate]);
}
