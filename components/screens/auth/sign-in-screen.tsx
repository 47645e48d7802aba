// Sign in with e-mail and password; links to the password reset request.
import { useState } from 'react';
import { View } from 'react-native';
import { useRouter } from 'expo-router';
import { errorSentence } from '@/components/data/error-sentences';
import { useSessionActions } from '@/components/data/use-me';
import { homeTabFor } from '@/components/navigation/role-tabs';
import { Button, Notice, TextField } from '@/components/ui';
import { AuthFrame } from './auth-frame';

export function SignInScreen() {
  const router = useRouter();
  const { signIn } = useSessionActions();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [missing, setMissing] = useState<{ email?: string; password?: string }>({});

  async function submit() {
    const problems = {
      email: email.trim() ? undefined : 'Enter your e-mail address.',
      password: password ? undefined : 'Enter your password.',
    };
    setMissing(problems);
    if (problems.email || problems.password) return;
    setBusy(true);
    setError(null);
    try {
      const me = await signIn(email.trim(), password);
      router.replace(`/${homeTabFor(me.role)}`);
    } catch (e) {
      setError(errorSentence(e));
      setBusy(false);
    }
  }

  return (
    <AuthFrame testID="sign-in-screen" title="Sign in" subtitle="Use the e-mail address your team invited.">
      {error ? <Notice tone="warning" message={error} testID="sign-in-error" /> : null}
      <TextField
        label="E-mail"
        testID="sign-in-email"
        value={email}
        onChangeText={setEmail}
        autoCapitalize="none"
        autoComplete="email"
        keyboardType="email-address"
        inputMode="email"
        error={missing.email}
        onSubmitEditing={submit}
      />
      <TextField
        label="Password"
        testID="sign-in-password"
        value={password}
        onChangeText={setPassword}
        secureTextEntry
        autoComplete="current-password"
        error={missing.password}
        onSubmitEditing={submit}
      />
      <Button label="Sign in" onPress={submit} busy={busy} testID="sign-in-submit" />
      <View style={{ alignSelf: 'center' }}>
        <Button label="Forgot your password?" variant="ghost" compact onPress={() => router.push('/forgot-password')} testID="sign-in-forgot" />
      </View>
    </AuthFrame>
  );
}
