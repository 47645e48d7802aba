// One proposal in full: header with badges and readiness, what and where with the part change,
// proof or counterexample, margins, assumptions relied on, decision, comments and the cautions.
// Rendered in the right pane of wide lists and as its own page on phones and deep links.
import { View } from 'react-native';
import { useMe } from '@/components/data/use-me';
import { useProposal } from '@/components/data/use-proposals';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Card, ErrorState, Loading, Text } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import { ProposalPictures } from '@/components/drawing/proposal-pictures';
import { Cautions } from './cautions';
import { ChangeCard } from './change-card';
import { CommentsCard } from './comments-card';
import { DecisionCard } from './decision-card';
import { EvidenceCard } from './evidence-card';
import { MarginsCard } from './margins-card';
import { ProposalBadges } from './proposal-badges';
import { READINESS_WORDS, ruleLabel } from './labels';

export function ProposalDetailView({ id }: { id: string }) {
  const { proposal, error, isLoading, retry } = useProposal(id);
  const { me } = useMe();
  const { spacing } = useTheme();
  if (error) return <ErrorState error={error} onRetry={retry} testID="proposal-error" />;
  if (isLoading || !proposal || !me) return <Loading label="Loading the proposal…" testID="proposal-loading" />;
  const readiness = READINESS_WORDS[proposal.readiness];
  return (
    <View testID="proposal-detail" style={{ gap: spacing.lg }}>
      <Card>
        <Text variant="overline" tone="faint">
          {proposal.designName} · revision {proposal.revision} · {ruleLabel(proposal.ruleId)}
        </Text>
        <Text variant="headline" testID="proposal-title">
          {proposal.title}
        </Text>
        <ProposalBadges proposal={proposal} testID="proposal" />
        <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
          <Text variant="label" tone="muted">
            Readiness
          </Text>
          <Badge label={readiness.label} tone={readiness.tone} testID="proposal-readiness" />
          <Text variant="caption" tone="faint">
            Scan started by {proposal.startedBy} · {formatDateTime(proposal.createdAt)}
          </Text>
        </View>
        {proposal.overlapsWith.length > 0 ? (
          <Text variant="caption" tone="warning">
            Changes the same parts as {proposal.overlapsWith.length} other proposal{proposal.overlapsWith.length === 1 ? '' : 's'}: accepting one puts the others out of date.
          </Text>
        ) : null}
      </Card>
      <ChangeCard proposal={proposal} />
      <ProposalPictures proposal={proposal} />
      <EvidenceCard proposal={proposal} />
      <MarginsCard proposal={proposal} />
      <Card title="Assumptions relied on" testID="proposal-assumptions">
        {proposal.evidence.assumptionsUsed.length === 0 ? (
          <Text tone="muted" testID="proposal-assumptions-empty">
            None: this rewrite holds whatever the rest of the machine does.
          </Text>
        ) : (
          proposal.evidence.assumptionsUsed.map((a) => (
            <Text key={a.id} variant="mono">
              {a.expression}
            </Text>
          ))
        )}
        {proposal.evidence.assumptionsUsed.length > 0 ? (
          <Text variant="caption" tone="muted">
            If any of these is edited or withdrawn the proposal goes out of date until the next scan.
          </Text>
        ) : null}
      </Card>
      <DecisionCard proposal={proposal} me={me} />
      <CommentsCard proposal={proposal} canComment={me.role !== 'viewer'} />
      <Cautions extra={proposal.cautions} testID="proposal-cautions" />
    </View>
  );
}
