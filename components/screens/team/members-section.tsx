// Members and pending invites of the current team, with the invite form on top.
import { useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { useMe } from '@/components/data/use-me';
import { useTeam, useTeamActions } from '@/components/data/use-team';
import type { Invite } from '@/components/data/types';
import { roleLabel } from '@/components/navigation/role-labels';
import { TwoPane } from '@/components/navigation/two-pane';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, EmptyState, ErrorState, ListRow, Loading, Notice, Text } from '@/components/ui';
import { formatDate } from '@/components/screens/common/format';
import { InviteForm } from './invite-form';
import { MemberDetail } from './member-detail';

export function MembersSection() {
  const { team, error, isLoading, retry } = useTeam();
  const { me } = useMe();
  const { spacing } = useTheme();
  const [selected, setSelected] = useState<string | null>(null);

  if (error) return <ErrorState error={error} onRetry={retry} />;
  if (isLoading || !team) return <Loading label="Loading the team…" />;

  const member = team.members.find((m) => m.userId === selected) ?? null;
  const list = (
    <View style={{ gap: spacing.lg }}>
      <Card title={`Members (${team.members.length})`} padded={false} testID="member-list">
        {team.members.map((m, i) => (
          <ListRow
            key={m.userId}
            testID={`member-${m.email}`}
            title={m.name || m.email}
            subtitle={m.email}
            trailing={<Badge label={roleLabel(m.role)} tone={m.role === 'admin' ? 'accent' : 'neutral'} />}
            onPress={() => setSelected(m.userId)}
            selected={m.userId === selected}
            accessibilityLabel={`${m.email}, ${roleLabel(m.role)}`}
            last={i === team.members.length - 1}
          />
        ))}
      </Card>
      <PendingInvites invites={team.invites} />
    </View>
  );

  return (
    <TwoPane
      testID="members"
      list={list}
      aside={<InviteForm />}
      detail={member ? <MemberDetail key={member.userId} member={member} isSelf={member.userId === me?.user.id} onRemoved={() => setSelected(null)} /> : null}
      placeholder={<EmptyState icon="members" title="Choose a member" body="Pick someone on the left to change their role or remove them from the team." testID="member-placeholder" />}
      onBack={() => setSelected(null)}
      backLabel="All members"
    />
  );
}

function PendingInvites({ invites }: { invites: Invite[] }) {
  const { cancelInvite } = useTeamActions();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  if (invites.length === 0) {
    return (
      <Text variant="caption" tone="faint" testID="invites-empty">
        No invites are waiting for an answer.
      </Text>
    );
  }
  return (
    <Card title={`Waiting invites (${invites.length})`} padded={false} testID="invite-list">
      {error ? <Notice tone="warning" message={error} /> : null}
      {invites.map((invite, i) => (
        <ListRow
          key={invite.id}
          testID={`invite-${invite.email}`}
          title={invite.email}
          subtitle={`${roleLabel(invite.role)} · link expires ${formatDate(invite.expiresAt)}`}
          last={i === invites.length - 1}
          trailing={
            <Button
              label="Withdraw"
              variant="ghost"
              compact
              busy={busy === invite.id}
              testID={`invite-cancel-${invite.email}`}
              accessibilityLabel={`Withdraw the invite to ${invite.email}`}
              onPress={async () => {
                setBusy(invite.id);
                setError(null);
                try {
                  await cancelInvite(invite.id);
                } catch (e) {
                  setError(errorSentence(e));
                } finally {
                  setBusy(null);
                }
              }}
            />
          }
        />
      ))}
    </Card>
  );
}
