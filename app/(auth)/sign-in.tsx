// /sign-in
import { Stack } from 'expo-router';
import { SignInScreen } from '@/components/screens/auth/sign-in-screen';
import { SignedOutOnly } from '@/components/screens/shell/signed-out-only';

export default function SignInRoute() {
  return (
    <SignedOutOnly>
      <Stack.Screen options={{ title: 'Sign in · Trimwire' }} />
      <SignInScreen />
    </SignedOutOnly>
  );
}
