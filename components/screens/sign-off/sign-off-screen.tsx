// The review queue: open proposals across the team's designs (not from the reviewer's own scans),
// with the chosen one's evidence and decision beside the list on wide windows (?proposal=).
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useMe } from '@/components/data/use-me';
import { useReviewQueue } from '@/components/data/use-review-queue';
import { TwoPane } from '@/components/navigation/two-pane';
import { Card, EmptyState, ErrorState, Loading, Screen } from '@/components/ui';
import { ProposalDetailView } from '@/components/screens/proposals/proposal-detail';
import { ProposalRow } from '@/components/screens/proposals/proposal-row';

export function SignOffScreen() {
  const router = useRouter();
  const { me } = useMe();
  const params = useLocalSearchParams<{ proposal?: string }>();
  const { queue, error, isLoading, retry } = useReviewQueue();
  const frame = (body: React.ReactNode, subtitle?: string) => (
    <Screen testID="sign-off-screen" title="Sign-off" subtitle={subtitle ?? me?.team.name} width="full">
      {body}
    </Screen>
  );
  if (error) return frame(<ErrorState error={error} onRetry={retry} testID="sign-off-error" />);
  if (isLoading || !queue) return frame(<Loading label="Loading the proposals waiting for you…" testID="sign-off-loading" />);
  // A proposal decided a moment ago leaves the queue but stays open in the pane until another is chosen.
  const selected = params.proposal || null;
  if (queue.length === 0 && !selected) {
    return frame(
      <EmptyState icon="signOff" title="Nothing waiting for you" body="When a designer's scan proposes a rewrite it joins this queue with its proof, margins and part change. Proposals from your own scans go to another reviewer." testID="sign-off-empty" />,
    );
  }
  return frame(
    <TwoPane
      testID="sign-off"
      list={
        queue.length === 0 ? (
          <EmptyState icon="check" title="All decided" body="Nothing else is waiting for a decision." testID="sign-off-empty" />
        ) : (
          <Card padded={false} testID="sign-off-list">
            {queue.map((p, i) => (
              <ProposalRow key={p.id} proposal={p} designName={p.designName} selected={p.id === selected} onPress={() => router.setParams({ proposal: p.id })} last={i === queue.length - 1} />
            ))}
          </Card>
        )
      }
      detail={selected ? <ProposalDetailView id={selected} /> : null}
      placeholder={<EmptyState icon="signOff" title="Choose a proposal" body="Read its proof, margins and part change, then accept it or reject it with a reason." testID="sign-off-placeholder" />}
      onBack={() => router.setParams({ proposal: '' })}
      backLabel="Back to the queue"
    />,
    `${queue.length} waiting for a decision`,
  );
}
