// The root address: sends signed-out people to sign-in and everyone else to their first tab.
import { Redirect } from 'expo-router';
import { homeTabFor } from '@/components/navigation/role-tabs';
import { SessionGate } from './session-gate';

export function Landing() {
  return <SessionGate>{(me) => <Redirect href={`/${homeTabFor(me.role)}`} />}</SessionGate>;
}
