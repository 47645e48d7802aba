// One member: who they are, their role (admins can change it) and removal with a confirm step.
import { useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { useTeamActions } from '@/components/data/use-team';
import type { Member, Role } from '@/components/data/types';
import { roleSummary } from '@/components/navigation/role-labels';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, ChoiceChips, Notice, Text } from '@/components/ui';
import { formatDate } from '@/components/screens/common/format';
import { ROLE_CHOICES } from './role-choices';

export function MemberDetail({ member, isSelf, onRemoved }: { member: Member; isSelf: boolean; onRemoved: () => void }) {
  const { spacing } = useTheme();
  const { changeRole, removeMember } = useTeamActions();
  const [busy, setBusy] = useState<'role' | 'remove' | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [message, setMessage] = useState<{ tone: 'success' | 'warning'; text: string } | null>(null);

  async function setRole(role: Role) {
    if (role === member.role) return;
    setBusy('role');
    setMessage(null);
    try {
      await changeRole(member.userId, role);
      setMessage({ tone: 'success', text: `${member.name || member.email} is now ${ROLE_CHOICES.find((c) => c.value === role)?.label.toLowerCase()}.` });
    } catch (e) {
      setMessage({ tone: 'warning', text: errorSentence(e) });
    } finally {
      setBusy(null);
    }
  }

  async function remove() {
    setBusy('remove');
    setMessage(null);
    try {
      await removeMember(member.userId);
      onRemoved();
    } catch (e) {
      setMessage({ tone: 'warning', text: errorSentence(e) });
      setBusy(null);
      setConfirming(false);
    }
  }

  return (
    <Card testID="member-detail">
      <View style={{ gap: spacing.xxs }}>
        <Text variant="title">{member.name || member.email}</Text>
        <Text tone="muted">{member.email}</Text>
        <Text variant="caption" tone="faint">
          Member since {formatDate(member.joinedAt)}
          {isSelf ? ' · this is you' : ''}
        </Text>
      </View>
      {message ? <Notice tone={message.tone} message={message.text} testID="member-result" /> : null}
      <View style={{ gap: spacing.xs }}>
        <Text variant="label" tone="muted">
          Role
        </Text>
        <ChoiceChips choices={ROLE_CHOICES} value={member.role} onChange={setRole} testID="member-role" label={`Role of ${member.email}`} />
        <Text variant="caption" tone="faint">
          {roleSummary(member.role)}
        </Text>
      </View>
      <View style={{ flexDirection: 'row', gap: spacing.sm, flexWrap: 'wrap' }}>
        {confirming ? (
          <>
            <Button label={`Remove ${member.name || member.email}`} variant="danger" onPress={remove} busy={busy === 'remove'} testID="member-remove-confirm" />
            <Button label="Keep" variant="secondary" onPress={() => setConfirming(false)} testID="member-remove-cancel" />
          </>
        ) : (
          <Button label="Remove from team" variant="danger" compact onPress={() => setConfirming(true)} testID="member-remove" accessibilityLabel={`Remove ${member.email} from the team`} />
        )}
      </View>
    </Card>
  );
}
