// Each board's use of its budget (parts, area, cost) now and after the accepted proposals.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Card, EmptyState, ProgressBar, Text, type ProgressTone } from '@/components/ui';
import type { Board } from '@/shared/api/boards';

type Measure = { key: 'parts' | 'areaMm2' | 'cost'; label: string; format: (v: number, currency: string) => string };

const MEASURES: readonly Measure[] = [
  { key: 'parts', label: 'Parts', format: (v) => String(Math.round(v)) },
  { key: 'areaMm2', label: 'Board area', format: (v) => `${v.toFixed(0)} mm²` },
  { key: 'cost', label: 'Cost', format: (v, c) => `${v.toFixed(2)} ${c}` },
];

export function budgetTone(use: number, budget: number): ProgressTone {
  if (use > budget) return 'danger';
  return use > budget * 0.9 ? 'warning' : 'success';
}

function BudgetLine({ board, m }: { board: Board; m: Measure }) {
  const { spacing } = useTheme();
  const before = board.usage.before[m.key];
  const after = board.usage.afterAccepted[m.key];
  const budget = board.budget[m.key];
  const fmt = (v: number) => m.format(v, board.currency);
  const change = after !== before ? ` → ${fmt(after)} after accepted proposals` : '';
  if (budget === undefined) {
    return (
      <Text variant="caption" tone="muted">
        {m.label}: {fmt(before)}
        {change} (no budget set)
      </Text>
    );
  }
  const over = after > budget;
  return (
    <View style={{ gap: spacing.xs }} testID={`board-${board.id}-${m.key}`}>
      <View style={{ flexDirection: 'row', justifyContent: 'space-between', gap: spacing.sm }}>
        <Text variant="label">{m.label}</Text>
        <Text variant="caption" tone={over ? 'danger' : 'muted'}>
          {fmt(before)}
          {change} of {fmt(budget)}
        </Text>
      </View>
      <ProgressBar value={budget > 0 ? before / budget : 1} after={budget > 0 ? after / budget : 1} tone={budgetTone(after, budget)} label={`${board.name} ${m.label}: ${fmt(before)} now, ${fmt(after)} after accepted proposals, budget ${fmt(budget)}`} />
      {over ? (
        <Text variant="caption" tone="danger">
          Over budget by {fmt(after - budget)}
          {after !== before ? ' even after the accepted proposals' : ''}.
        </Text>
      ) : null}
    </View>
  );
}

export function BoardBudgets({ boards }: { boards: readonly Board[] }) {
  const { spacing } = useTheme();
  return (
    <Card title="Boards and budgets" description="Use now, and after the accepted proposals are applied (lighter part of each bar)." testID="design-boards">
      {boards.length === 0 ? (
        <EmptyState icon="bench" title="No boards yet" body="Give a board name and budget when you upload, and the design's use of it shows here." testID="design-boards-empty" />
      ) : (
        boards.map((board) => (
          <View key={board.id} style={{ gap: spacing.sm }} testID={`board-${board.id}`}>
            <View style={{ gap: spacing.xxs }}>
              <Text variant="bodyStrong">{board.name}</Text>
              <Text variant="caption" tone="faint">
                {board.instances.length ? `Instances ${board.instances.join(', ')}` : 'The whole design'}
              </Text>
            </View>
            {MEASURES.map((m) => (
              <BudgetLine key={m.key} board={board} m={m} />
            ))}
          </View>
        ))
      )}
    </Card>
  );
}
