// Ask for a password reset link; the answer is the same whether or not the account exists.
import { useState } from 'react';
import { View } from 'react-native';
import { useRouter } from 'expo-router';
import { errorSentence } from '@/components/data/error-sentences';
import { useSessionActions } from '@/components/data/use-me';
import { Button, Notice, TextField } from '@/components/ui';
import { AuthFrame } from './auth-frame';

export function ForgotPasswordScreen() {
  const router = useRouter();
  const { requestPasswordReset } = useSessionActions();
  const [email, setEmail] = useState('');
  const [busy, setBusy] = useState(false);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [missing, setMissing] = useState<string | null>(null);

  async function submit() {
    const address = email.trim();
    setMissing(address ? null : 'Enter your e-mail address.');
    if (!address) return;
    setBusy(true);
    setError(null);
    try {
      await requestPasswordReset(address);
      setSentTo(address);
    } catch (e) {
      setError(errorSentence(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <AuthFrame testID="forgot-password-screen" title="Reset your password" subtitle="We will e-mail you a link to choose a new password. It works once and expires after an hour.">
      {sentTo ? <Notice tone="success" message={`If ${sentTo} has an account, a reset link is on its way.`} testID="forgot-password-sent" /> : null}
      {error ? <Notice tone="warning" message={error} testID="forgot-password-error" /> : null}
      <TextField
        label="E-mail"
        testID="forgot-password-email"
        value={email}
        onChangeText={setEmail}
        autoCapitalize="none"
        autoComplete="email"
        keyboardType="email-address"
        inputMode="email"
        error={missing}
        onSubmitEditing={submit}
      />
      <Button label="Send reset link" onPress={submit} busy={busy} testID="forgot-password-submit" />
      <View style={{ alignSelf: 'center' }}>
        <Button label="Back to sign in" variant="ghost" compact icon="back" onPress={() => router.replace('/sign-in')} testID="forgot-password-back" />
      </View>
    </AuthFrame>
  );
}
