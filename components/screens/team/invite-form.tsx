// Invite someone by e-mail with a role; they get a single-use link to choose a password.
import { useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { useTeamActions } from '@/components/data/use-team';
import type { Role } from '@/components/data/types';
import { roleSummary } from '@/components/navigation/role-labels';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, ChoiceChips, Notice, Text, TextField } from '@/components/ui';
import { ROLE_CHOICES } from './role-choices';

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

export function InviteForm() {
  const { spacing } = useTheme();
  const { invite } = useTeamActions();
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('designer');
  const [busy, setBusy] = useState(false);
  const [fieldError, setFieldError] = useState<string | null>(null);
  const [result, setResult] = useState<{ tone: 'success' | 'warning'; message: string } | null>(null);

  async function submit() {
    const address = email.trim();
    if (!EMAIL.test(address)) {
      setFieldError('Enter an e-mail address like name@example.com.');
      return;
    }
    setFieldError(null);
    setBusy(true);
    setResult(null);
    try {
      await invite(address, role);
      setResult({ tone: 'success', message: `Invite sent to ${address}. The link works once and expires in 7 days.` });
      setEmail('');
    } catch (e) {
      setResult({ tone: 'warning', message: errorSentence(e) });
    } finally {
      setBusy(false);
    }
  }

  return (
    <Card title="Invite someone" description="They receive an e-mail with a link to choose a password and join the team.">
      {result ? <Notice tone={result.tone} message={result.message} testID="invite-result" /> : null}
      <TextField label="E-mail" testID="invite-email" value={email} onChangeText={setEmail} autoCapitalize="none" keyboardType="email-address" inputMode="email" error={fieldError} />
      <View style={{ gap: spacing.xs }}>
        <Text variant="label" tone="muted">
          Role
        </Text>
        <ChoiceChips choices={ROLE_CHOICES} value={role} onChange={setRole} testID="invite-role" label="Role" />
        <Text variant="caption" tone="faint">
          {roleSummary(role)}
        </Text>
      </View>
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Send invite" icon="mail" onPress={submit} busy={busy} testID="invite-submit" />
      </View>
    </Card>
  );
}
