// The review queue: proposals waiting for an accept or reject with a recorded reason.
import { ComingFeatureScreen } from '@/components/screens/common/coming-feature-screen';

export function SignOffScreen() {
  return (
    <ComingFeatureScreen
      testID="sign-off-screen"
      title="Sign-off"
      icon="signOff"
      emptyTitle="Proposals waiting for your decision will appear here"
      emptyBody="When a designer's scan proposes a rewrite, it joins this queue with its evidence: the proof or counterexample, margins at worst-case corners and the change in parts."
      steps={[
        'Read what a rewrite changes and where, with the before and after of the region.',
        'Check the assumptions it relies on and whether its margins pass.',
        'Accept or reject it with a reason; the decision is kept in the audit log.',
        'Proposals from your own scans go to another reviewer.',
      ]}
    />
  );
}
