// One proposal as a page of its own: /designs/:id/proposals/:pid from the lists, or /proposals/:id
// from decision e-mails (then "back" leads to the person's own starting point).
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { useMe } from '@/components/data/use-me';
import { Button, Screen } from '@/components/ui';
import { ProposalDetailView } from './proposal-detail';

export function ProposalScreen() {
  const router = useRouter();
  const { me } = useMe();
  const { id, pid } = useLocalSearchParams<{ id: string; pid?: string }>();
  const fromDesign = typeof pid === 'string' && pid !== '';
  const home = me?.role === 'reviewer' ? '/sign-off' : '/bench';
  return (
    <Screen testID="proposal-screen" width="content">
      <View style={{ alignSelf: 'flex-start' }}>
        <Button
          label={fromDesign ? 'All proposals' : me?.role === 'reviewer' ? 'Sign-off' : 'Bench'}
          icon="back"
          variant="ghost"
          compact
          onPress={() => router.navigate(fromDesign ? `/designs/${id}/proposals` : home)}
          testID="proposal-back"
          accessibilityLabel={fromDesign ? "Back to the design's proposals" : 'Back'}
        />
      </View>
      <ProposalDetailView id={fromDesign ? pid : id} />
    </Screen>
  );
}
