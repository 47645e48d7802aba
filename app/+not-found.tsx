// Any unknown address.
import { Stack } from 'expo-router';
import { NotFoundScreen } from '@/components/screens/shell/not-found-screen';

export default function NotFoundRoute() {
  return (
    <>
      <Stack.Screen options={{ title: 'Not found · Trimwire' }} />
      <NotFoundScreen />
    </>
  );
}
