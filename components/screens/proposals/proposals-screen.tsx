// A design's proposals: filter and sort, the list, and the chosen proposal beside it on wide
// windows (or in its place on phones). Filters and the choice live in the URL.
import { useLocalSearchParams, useRouter } from 'expo-router';
import { View } from 'react-native';
import { useDesign } from '@/components/data/use-designs';
import { useProposals } from '@/components/data/use-proposals';
import type { ProposalFilters } from '@/components/data/workflow-keys';
import { TwoPane } from '@/components/navigation/two-pane';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, EmptyState, ErrorState, Loading, Screen } from '@/components/ui';
import { ProposalFiltersCard } from './proposal-filters';
import { ProposalDetailView } from './proposal-detail';
import { ProposalRow } from './proposal-row';

type Params = { id: string; proposal?: string; rule?: string; status?: string; verdict?: string; board?: string; sort?: string };

export function ProposalsScreen() {
  const router = useRouter();
  const { spacing } = useTheme();
  const params = useLocalSearchParams<Params>();
  const designId = params.id;
  const filters = {
    rule: params.rule || undefined,
    status: params.status || undefined,
    verdict: params.verdict || undefined,
    board: params.board || undefined,
    sort: params.sort || undefined,
  } as ProposalFilters;
  const { design } = useDesign(designId);
  // The unfiltered list names the rules present, for the rule filter.
  const { proposals: all } = useProposals(designId);
  const { proposals, error, isLoading, retry } = useProposals(designId, filters);
  const selected = params.proposal || null;
  const rules = [...new Set((all ?? []).map((p) => p.ruleId))].sort();

  const header = (
    <View style={{ gap: spacing.md }}>
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label={design?.name ?? 'Design'} icon="back" variant="ghost" compact onPress={() => router.navigate(`/designs/${designId}`)} testID="proposals-back" accessibilityLabel="Back to the design" />
      </View>
      <ProposalFiltersCard
        filters={filters}
        rules={rules}
        boards={design?.boards ?? []}
        onChange={(next) => router.setParams({ rule: next.rule ?? '', status: next.status ?? '', verdict: next.verdict ?? '', board: next.board ?? '', sort: next.sort ?? '' })}
      />
    </View>
  );

  let list: React.ReactNode;
  if (error) list = <ErrorState error={error} onRetry={retry} testID="proposals-error" />;
  else if (isLoading || !proposals) list = <Loading label="Loading proposals…" testID="proposals-loading" />;
  else if (proposals.length === 0)
    list = (
      <EmptyState
        icon="scan"
        title={all && all.length > 0 ? 'No proposals match' : 'No proposals yet'}
        body={all && all.length > 0 ? 'Change the filters to see the others.' : 'Run a scan from the design overview; the rewrites it finds show here.'}
        testID="proposals-empty"
      />
    );
  else
    list = (
      <Card padded={false} testID="proposals-list">
        {proposals.map((p, i) => (
          <ProposalRow key={p.id} proposal={p} selected={p.id === selected} onPress={() => router.setParams({ proposal: p.id })} last={i === proposals.length - 1} />
        ))}
      </Card>
    );

  return (
    <Screen testID="proposals-screen" title="Proposals" subtitle={design ? `${design.name} · ${proposals?.length ?? 0} shown` : undefined} width="full">
      <TwoPane
        testID="proposals"
        list={
          <View style={{ gap: spacing.md }}>
            {header}
            {list}
          </View>
        }
        detail={selected ? <ProposalDetailView id={selected} /> : null}
        placeholder={<EmptyState icon="scan" title="Choose a proposal" body="Its change, proof, margins and decision show here." testID="proposals-placeholder" />}
        onBack={() => router.setParams({ proposal: '' })}
        backLabel="All proposals"
      />
    </Screen>
  );
}
