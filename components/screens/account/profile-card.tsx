// The person's display name and e-mail address.
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { useAccountActions } from '@/components/data/use-account';
import type { AccountView } from '@/components/data/types';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, Notice, Text, TextField } from '@/components/ui';

export function ProfileCard({ account }: { account: AccountView }) {
  const { spacing } = useTheme();
  const { update } = useAccountActions();
  const [name, setName] = useState(account.user.name);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: 'success' | 'warning'; text: string } | null>(null);
  useEffect(() => setName(account.user.name), [account.user.name]);

  async function save() {
    const trimmed = name.trim();
    if (!trimmed) {
      setMessage({ tone: 'warning', text: 'Your name cannot be empty.' });
      return;
    }
    setBusy(true);
    setMessage(null);
    try {
      await update({ name: trimmed });
      setMessage({ tone: 'success', text: 'Name saved.' });
    } catch (e) {
      setMessage({ tone: 'warning', text: errorSentence(e) });
    } finally {
      setBusy(false);
    }
  }

  return (
    <Card title="Profile">
      {message ? <Notice tone={message.tone} message={message.text} testID="profile-result" /> : null}
      <View style={{ gap: spacing.xxs }}>
        <Text variant="label" tone="muted">
          E-mail
        </Text>
        <Text testID="account-email">{account.user.email}</Text>
      </View>
      <TextField label="Name" testID="account-name" value={name} onChangeText={setName} autoComplete="name" onSubmitEditing={save} />
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Save name" variant="secondary" onPress={save} busy={busy} disabled={name.trim() === account.user.name} testID="account-name-save" />
      </View>
    </Card>
  );
}
