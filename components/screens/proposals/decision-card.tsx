// The review decision: accept, or reject with a required reason; the record of past decisions;
// and, when the person may not decide, the reason why instead of the buttons.
import { useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { useProposalActions } from '@/components/data/use-proposals';
import type { Me } from '@/components/data/types';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, Notice, Text, TextField } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import type { ProposalDetail } from '@/shared/api/proposals';
import { decisionAccess } from './decision-rules';

const READINESS_WARNINGS: Record<Exclude<ProposalDetail['readiness'], 'ready'>, string> = {
  refuted: 'The check found inputs where this rewrite changes an output (see the counterexample). Accepting it would change what the circuit does.',
  'failing-margins': 'This rewrite fails at least one electrical margin. Accept it only if you have a reason the margin does not apply.',
  unverified: 'No proof ran for this rewrite. Read the change yourself before accepting it.',
};

export function DecisionCard({ proposal, me }: { proposal: ProposalDetail; me: Me }) {
  const { spacing } = useTheme();
  const { decide } = useProposalActions();
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | null>(null);
  const [busy, setBusy] = useState<'accept' | 'reject' | null>(null);
  const [result, setResult] = useState<{ tone: 'success' | 'warning'; message: string } | null>(null);
  const access = decisionAccess(proposal, me);

  async function submit(decision: 'accept' | 'reject') {
    const text = reason.trim();
    if (decision === 'reject' && !text) {
      setReasonError('Say why you reject it: the designer reads this reason.');
      return;
    }
    setReasonError(null);
    setBusy(decision);
    setResult(null);
    try {
      await decide(proposal, { decision, ...(text ? { reason: text } : {}) });
      setResult({ tone: 'success', message: decision === 'accept' ? 'Accepted. The designer can now apply it.' : 'Rejected. The designer has your reason.' });
      setReason('');
    } catch (e) {
      setResult({ tone: 'warning', message: errorSentence(e) });
    } finally {
      setBusy(null);
    }
  }

  return (
    <Card title="Decision" testID="proposal-decision">
      {result ? <Notice tone={result.tone} message={result.message} testID="proposal-decision-result" /> : null}
      {proposal.decisions.length === 0 ? (
        <Text tone="muted">No decision yet.</Text>
      ) : (
        proposal.decisions.map((d, i) => (
          <View key={`${d.at}-${i}`} testID={`proposal-decision-${i}`} style={{ gap: spacing.xxs }}>
            <Text variant="bodyStrong" tone={d.decision === 'accept' ? 'success' : 'danger'}>
              {d.decision === 'accept' ? 'Accepted' : 'Rejected'} by {d.reviewer}
            </Text>
            <Text variant="caption" tone="muted">
              {formatDateTime(d.at)}
            </Text>
            {d.reason ? <Text>“{d.reason}”</Text> : null}
          </View>
        ))
      )}
      {access.canDecide ? (
        <View style={{ gap: spacing.md }}>
          {proposal.readiness !== 'ready' ? <Notice tone="warning" message={READINESS_WARNINGS[proposal.readiness]} testID="proposal-not-ready" /> : null}
          <TextField
            label="Reason"
            hint="Optional when accepting, required when rejecting."
            testID="proposal-reason"
            value={reason}
            onChangeText={setReason}
            multiline
            error={reasonError}
          />
          <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.sm }}>
            <Button label="Accept" icon="check" onPress={() => void submit('accept')} busy={busy === 'accept'} disabled={busy !== null} testID="proposal-accept" accessibilityLabel="Accept this proposal" />
            <Button label="Reject" icon="close" variant="danger" onPress={() => void submit('reject')} busy={busy === 'reject'} disabled={busy !== null} testID="proposal-reject" accessibilityLabel="Reject this proposal with the reason given" />
          </View>
        </View>
      ) : access.why ? (
        <Notice tone="info" message={access.why} testID="proposal-decision-unavailable" />
      ) : null}
    </Card>
  );
}
