// Filters (rule, status, proof, board) and sort for a design's proposals, folded away behind one
// button on phones so the list stays in view.
import { useState } from 'react';
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { useLayoutSize } from '@/components/theme/use-layout';
import { Button, Card, ChoiceChips, Text, type Choice } from '@/components/ui';
import type { ProposalFilters } from '@/components/data/workflow-keys';
import { PROPOSAL_STATUSES, VERDICTS } from '@/shared/api/proposals';
import { ruleLabel, STATUS_WORDS, VERDICT_WORDS } from './labels';

const ALL = 'all';
const SORTS: readonly Choice<string>[] = [
  { value: 'savings', label: 'Most saved' },
  { value: 'rule', label: 'Rule' },
  { value: 'status', label: 'Status' },
  { value: 'created', label: 'Newest' },
];

export function ProposalFiltersCard({ filters, onChange, rules, boards }: { filters: ProposalFilters; onChange: (next: ProposalFilters) => void; rules: readonly string[]; boards: readonly { id: string; name: string }[] }) {
  const { spacing } = useTheme();
  const wide = useLayoutSize() === 'wide';
  const [open, setOpen] = useState(false);
  const active = (['rule', 'status', 'verdict', 'board'] as const).filter((k) => filters[k]).length;
  const set = (key: keyof ProposalFilters) => (value: string) => onChange({ ...filters, [key]: value === ALL ? undefined : value });
  const row = (label: string, body: React.ReactNode) => (
    <View style={{ gap: spacing.xs }}>
      <Text variant="label" tone="muted">
        {label}
      </Text>
      {body}
    </View>
  );
  if (!wide && !open) {
    return (
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label={active ? `Filter and sort · ${active} on` : 'Filter and sort'} variant="secondary" compact onPress={() => setOpen(true)} testID="proposal-filters-open" />
      </View>
    );
  }
  return (
    <Card testID="proposal-filters">
      {row('Status', <ChoiceChips choices={[{ value: ALL, label: 'All' }, ...PROPOSAL_STATUSES.map((s) => ({ value: s, label: STATUS_WORDS[s].label }))]} value={filters.status ?? ALL} onChange={set('status')} testID="filter-status" label="Status" />)}
      {row('Proof', <ChoiceChips choices={[{ value: ALL, label: 'All' }, ...VERDICTS.map((v) => ({ value: v, label: VERDICT_WORDS[v].label }))]} value={filters.verdict ?? ALL} onChange={set('verdict')} testID="filter-verdict" label="Proof" />)}
      {rules.length > 1 ? row('Rule', <ChoiceChips choices={[{ value: ALL, label: 'All' }, ...rules.map((r) => ({ value: r, label: ruleLabel(r) }))]} value={filters.rule ?? ALL} onChange={set('rule')} testID="filter-rule" label="Rule" />) : null}
      {boards.length > 0 ? row('Board', <ChoiceChips choices={[{ value: ALL, label: 'All' }, ...boards.map((b) => ({ value: b.id, label: b.name }))]} value={filters.board ?? ALL} onChange={set('board')} testID="filter-board" label="Board" />) : null}
      {row('Sort by', <ChoiceChips choices={SORTS} value={filters.sort ?? 'savings'} onChange={set('sort')} testID="sort" label="Sort by" />)}
      {!wide ? (
        <View style={{ alignSelf: 'flex-start' }}>
          <Button label="Done" variant="ghost" compact onPress={() => setOpen(false)} testID="proposal-filters-close" />
        </View>
      ) : null}
    </Card>
  );
}
