// The evidence behind a proposal: proved (how, under which assumptions) or refuted with the
// counterexample as a table of inputs and outputs before and after; then what switch-level
// simulation saw (contention, floating reads, sneak paths).
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Card, DataTable, Text } from '@/components/ui';
import type { ProposalDetail } from '@/shared/api/proposals';
import { VERDICT_WORDS } from './labels';

const METHOD_WORDS: Record<string, string> = {
  exhaustive: 'by checking every input combination',
  sat: 'with a SAT solver over all input combinations',
  random: 'on random input vectors only (not a proof)',
  'switch-level': 'by switch-level simulation',
  none: 'without a comparison (nothing comparable changed)',
};

export function evidenceSentence(p: Pick<ProposalDetail, 'evidence'>): string {
  const { verdict, method, assumptionsUsed } = p.evidence;
  const how = METHOD_WORDS[method] ?? `by ${method}`;
  const under = assumptionsUsed.length ? ` under ${assumptionsUsed.map((a) => a.expression).join(', ')}` : ' with no assumptions';
  if (verdict === 'proved') return `Proved equivalent ${how}${under}.`;
  if (verdict === 'refuted') return `Refuted ${how}${under}: the rewrite changes an output for the inputs below.`;
  return `Not proved ${how}. Treat this rewrite as unchecked.`;
}

function Findings({ label, items, testID }: { label: string; items: readonly string[]; testID: string }) {
  const { spacing } = useTheme();
  return (
    <View testID={testID} style={{ gap: spacing.xxs }}>
      <Text variant="label">
        {label}: {items.length === 0 ? 'none' : items.length}
      </Text>
      {items.slice(0, 8).map((item) => (
        <Text key={item} variant="mono" tone="danger">
          {item}
        </Text>
      ))}
    </View>
  );
}

export function EvidenceCard({ proposal }: { proposal: ProposalDetail }) {
  const { spacing } = useTheme();
  const { evidence } = proposal;
  const word = VERDICT_WORDS[evidence.verdict];
  const cx = evidence.counterexample;
  const inputNames = cx ? Object.keys(cx.inputs) : [];
  return (
    <Card title="Proof" testID="proposal-evidence">
      <View style={{ flexDirection: 'row', gap: spacing.sm, alignItems: 'center' }}>
        <Badge label={word.label} tone={word.tone} testID="proposal-evidence-verdict" />
        <Text variant="caption" tone="muted">
          {evidence.compared.length} signal{evidence.compared.length === 1 ? '' : 's'} compared
        </Text>
      </View>
      <Text testID="proposal-evidence-sentence">{evidenceSentence(proposal)}</Text>
      {cx ? (
        <View style={{ gap: spacing.sm }}>
          <Text variant="overline" tone="muted">
            Counterexample
          </Text>
          <DataTable testID="proposal-counterexample-inputs" caption="Inputs of the counterexample" columns={[{ title: 'Input', weight: 2 }, { title: 'Value', numeric: true }]} rows={inputNames.map((n) => [n, String(cx.inputs[n])])} />
          <DataTable
            testID="proposal-counterexample-outputs"
            caption="Outputs before and after the rewrite"
            columns={[{ title: 'Output', weight: 2 }, { title: 'Before', numeric: true }, { title: 'After', numeric: true }]}
            rows={cx.outputs.map((o) => [o.name, String(o.before), String(o.after)])}
          />
        </View>
      ) : null}
      <View style={{ gap: spacing.sm }}>
        <Text variant="overline" tone="muted">
          Switch-level simulation ({evidence.switchSim.vectors} vector{evidence.switchSim.vectors === 1 ? '' : 's'})
        </Text>
        <Findings label="Contention" items={evidence.switchSim.contention} testID="proposal-sim-contention" />
        <Findings label="Floating reads" items={evidence.switchSim.floating} testID="proposal-sim-floating" />
        <Findings label="Sneak paths" items={evidence.switchSim.sneakPaths} testID="proposal-sim-sneak" />
      </View>
      {evidence.note ? (
        <Text variant="caption" tone="muted">
          {evidence.note}
        </Text>
      ) : null}
    </Card>
  );
}
