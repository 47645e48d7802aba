// A design's overview as a page of its own (links from mail, the upload form, other screens).
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { Button, Screen } from '@/components/ui';
import { DesignOverview } from './design-overview';

export function DesignScreen() {
  const router = useRouter();
  const { id } = useLocalSearchParams<{ id: string }>();
  return (
    <Screen testID="design-screen" width="content">
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="Bench" icon="back" variant="ghost" compact onPress={() => router.navigate(`/bench?design=${id}`)} testID="design-back" accessibilityLabel="Back to the bench" />
      </View>
      <DesignOverview id={id} />
    </Screen>
  );
}
