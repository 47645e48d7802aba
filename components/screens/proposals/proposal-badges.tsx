// The three badges a proposal carries everywhere it is listed: proof, margins and status.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Badge } from '@/components/ui';
import type { ProposalSummary } from '@/shared/api/proposals';
import { MARGIN_WORDS, STATUS_WORDS, VERDICT_WORDS } from './labels';

export function ProposalBadges({ proposal, testID }: { proposal: Pick<ProposalSummary, 'verdict' | 'marginStatus' | 'status'>; testID: string }) {
  const { spacing } = useTheme();
  const verdict = VERDICT_WORDS[proposal.verdict];
  const margin = MARGIN_WORDS[proposal.marginStatus];
  const status = STATUS_WORDS[proposal.status];
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.xs }}>
      <Badge label={verdict.label} tone={verdict.tone} testID={`${testID}-verdict`} />
      <Badge label={margin.label} tone={margin.tone} testID={`${testID}-margins`} />
      <Badge label={status.label} tone={status.tone} testID={`${testID}-status`} />
    </View>
  );
}
