// Choose a password from an invite or reset link (the token arrives in the query string);
// success signs the person in.
import { useState } from 'react';
import { View } from 'react-native';
import { useLocalSearchParams, useRouter } from 'expo-router';
import { errorSentence } from '@/components/data/error-sentences';
import { useSessionActions } from '@/components/data/use-me';
import { homeTabFor } from '@/components/navigation/role-tabs';
import { Button, Notice, TextField } from '@/components/ui';
import { PASSWORD_MIN_LENGTH as MIN_PASSWORD_LENGTH } from '@/shared/api/auth';
import { AuthFrame } from './auth-frame';


export function SetPasswordScreen() {
  const router = useRouter();
  const params = useLocalSearchParams<{ token?: string }>();
  const token = typeof params.token === 'string' ? params.token : '';
  const { setPassword } = useSessionActions();
  const [password, setPasswordText] = useState('');
  const [confirm, setConfirm] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<{ password?: string; confirm?: string }>({});

  async function submit() {
    const problems = {
      password: password.length >= MIN_PASSWORD_LENGTH ? undefined : `Use at least ${MIN_PASSWORD_LENGTH} characters.`,
      confirm: confirm === password ? undefined : 'The two passwords differ.',
    };
    setFieldErrors(problems);
    if (problems.password || problems.confirm) return;
    setBusy(true);
    setError(null);
    try {
      const me = await setPassword(token, password);
      router.replace(`/${homeTabFor(me.role)}`);
    } catch (e) {
      setError(errorSentence(e));
      setBusy(false);
    }
  }

  if (!token) {
    return (
      <AuthFrame testID="set-password-screen" title="Choose a password" subtitle="This page opens from the link in an invite or password reset e-mail.">
        <Notice tone="warning" message="This link is missing its token. Open the link from the e-mail again, or ask for a new one." testID="set-password-no-token" />
        <Button label="Ask for a new link" variant="secondary" onPress={() => router.replace('/forgot-password')} testID="set-password-request-new" />
      </AuthFrame>
    );
  }

  return (
    <AuthFrame testID="set-password-screen" title="Choose a password" subtitle={`At least ${MIN_PASSWORD_LENGTH} characters. You will be signed in when it is saved.`}>
      {error ? <Notice tone="warning" message={error} testID="set-password-error" /> : null}
      <TextField label="New password" testID="set-password-password" value={password} onChangeText={setPasswordText} secureTextEntry autoComplete="new-password" error={fieldErrors.password} />
      <TextField label="Repeat the password" testID="set-password-confirm" value={confirm} onChangeText={setConfirm} secureTextEntry autoComplete="new-password" error={fieldErrors.confirm} onSubmitEditing={submit} />
      <Button label="Save password and sign in" onPress={submit} busy={busy} testID="set-password-submit" />
      <View style={{ alignSelf: 'center' }}>
        <Button label="Back to sign in" variant="ghost" compact icon="back" onPress={() => router.replace('/sign-in')} testID="set-password-back" />
      </View>
    </AuthFrame>
  );
}
