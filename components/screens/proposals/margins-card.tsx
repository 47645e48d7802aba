// Electrical margins of a proposal at their worst-case corners: value against limit, pass/warn/fail.
import { Badge, Card, DataTable, EmptyState, Text } from '@/components/ui';
import type { Margin, ProposalDetail } from '@/shared/api/proposals';
import { MARGIN_WORDS } from './labels';

function number(v: number): string {
  const a = Math.abs(v);
  if (a === 0) return '0';
  if (a >= 1000 || a < 0.01) return v.toExponential(2);
  return Number(v.toPrecision(3)).toString();
}

export function cornerText(c: Margin['corner']): string {
  const supply = `supply ${c.supply >= 0 ? '+' : ''}${c.supply}%`;
  return [supply, `R ${c.resistors}`, c.beta !== undefined ? `β ${c.beta}` : null].filter(Boolean).join(', ');
}

export function MarginsCard({ proposal }: { proposal: ProposalDetail }) {
  const word = MARGIN_WORDS[proposal.marginStatus];
  return (
    <Card title="Margins at worst-case corners" testID="proposal-margins">
      <Badge label={word.label} tone={word.tone} />
      {proposal.margins.length === 0 ? (
        <EmptyState icon="check" title="No margins to check" body="This rewrite changes no driver, line or load whose electrical limits apply." testID="proposal-margins-empty" />
      ) : (
        <DataTable
          testID="proposal-margins-table"
          caption="Margins"
          columns={[{ title: 'Margin', weight: 3 }, { title: 'Value', numeric: true, weight: 1.4 }, { title: 'Limit', numeric: true, weight: 1.4 }, { title: 'Corner', weight: 2.4 }, { title: 'Result', weight: 1.4 }]}
          rows={proposal.margins.map((m) => [
            m.note ? `${m.name} — ${m.note}` : m.name,
            `${number(m.value)} ${m.unit}`,
            `${number(m.limit)} ${m.unit}`,
            cornerText(m.corner),
            <Badge key="s" label={MARGIN_WORDS[m.status].label.replace('Margins ', '')} tone={MARGIN_WORDS[m.status].tone} />,
          ])}
        />
      )}
      {proposal.verdict === 'proved' && proposal.marginStatus === 'fail' ? (
        <Text tone="danger">Logically proved, but electrically failing: do not build this rewrite as it stands.</Text>
      ) : null}
    </Card>
  );
}
