// The charts card of a design overview: boards against budget, parts saved by rule (from the
// design's proposals) and part totals across revisions.
import { Card } from '@/components/ui';
import { useProposals } from '@/components/data/use-proposals';
import { BudgetChart, RevisionTotalsChart, SavingsByRuleChart, type BoardUse } from './charts';

export function DesignCharts({ design }: { design: { id: string; boards: BoardUse[]; revisions: { number: number; partCounts: { total: number } }[] } }) {
  const { proposals } = useProposals(design.id);
  return (
    <Card title="Charts" testID="design-charts">
      {design.boards.length ? <BudgetChart boards={design.boards} /> : null}
      {proposals && proposals.length ? <SavingsByRuleChart proposals={proposals} /> : null}
      {design.revisions.length ? <RevisionTotalsChart revisions={design.revisions} /> : null}
    </Card>
  );
}
