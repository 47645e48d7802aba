// /set-password?token=… — from invite and reset e-mails; open whether or not someone is signed in,
// because an invite can arrive in a browser where another account is signed in.
import { Stack } from 'expo-router';
import { SetPasswordScreen } from '@/components/screens/auth/set-password-screen';

export default function SetPasswordRoute() {
  return (
    <>
      <Stack.Screen options={{ title: 'Choose a password · Trimwire' }} />
      <SetPasswordScreen />
    </>
  );
}
