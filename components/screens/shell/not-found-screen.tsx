// Shown for any address the app does not know.
import { useRouter } from 'expo-router';
import { View } from 'react-native';
import { Button, EmptyState, Screen } from '@/components/ui';

export function NotFoundScreen() {
  const router = useRouter();
  return (
    <Screen testID="not-found-screen" title="Page not found">
      <EmptyState icon="alert" title="There is nothing at this address" body="The link may be old or mistyped. Your designs and team are still where you left them.">
        <View>
          <Button label="Go to Trimwire" onPress={() => router.replace('/')} testID="not-found-home" />
        </View>
      </EmptyState>
    </Screen>
  );
}
