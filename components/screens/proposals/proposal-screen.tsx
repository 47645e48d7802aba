// One proposal as a page of its own (links from mail and from other screens).
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { Button, Screen } from '@/components/ui';
import { ProposalDetailView } from './proposal-detail';

export function ProposalScreen() {
  const router = useRouter();
  const { id, pid } = useLocalSearchParams<{ id: string; pid: string }>();
  return (
    <Screen testID="proposal-screen" width="content">
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label="All proposals" icon="back" variant="ghost" compact onPress={() => router.navigate(`/designs/${id}/proposals`)} testID="proposal-back" accessibilityLabel="Back to the design's proposals" />
      </View>
      <ProposalDetailView id={pid} />
    </Screen>
  );
}
