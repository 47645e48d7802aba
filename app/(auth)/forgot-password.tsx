// /forgot-password
import { Stack } from 'expo-router';
import { ForgotPasswordScreen } from '@/components/screens/auth/forgot-password-screen';
import { SignedOutOnly } from '@/components/screens/shell/signed-out-only';

export default function ForgotPasswordRoute() {
  return (
    <SignedOutOnly>
      <Stack.Screen options={{ title: 'Reset password · Trimwire' }} />
      <ForgotPasswordScreen />
    </SignedOutOnly>
  );
}
