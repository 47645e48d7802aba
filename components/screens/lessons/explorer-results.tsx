// The explorer's recomputed figures: parts and cost before/after, the worst rise time, and every
// margin of every proposal with a pass/warn/fail badge and a bar of its value against its limit.
import { View } from 'react-native';
import type { ExplorerData, WhatIfResult } from '@/optimizer/whatif';
import { useTheme } from '@/components/theme/use-theme';
import { Card, DataTable, Notice, ProgressBar, Text } from '@/components/ui';
import { formatMoney, formatSi, PART_ROWS } from './explorer-format';
import { MarginBadge } from './margin-badge';


export function PartsCard({ result, explorer }: { result: WhatIfResult; explorer: ExplorerData }) {
  const { parts, currency } = result;
  const rows = PART_ROWS.filter(([k]) => parts.before[k] > 0 || parts.after[k] > 0).map(([k, label]) => [label, String(parts.before[k]), String(parts.after[k]), String(parts.saved[k])]);
  // The currency goes in the row's name so the cells stay short enough for a phone.
  rows.push([`Cost (${currency})`, formatMoney(parts.before.cost), formatMoney(parts.after.cost), formatMoney(parts.saved.cost)]);
  return (
    <Card title="Parts and cost" description={explorer.pricesNote} testID="explorer-parts">
      <DataTable
        testID="explorer-parts-table"
        caption="Part counts and cost before and after the proposals switched on"
        columns={[{ title: 'Part', weight: 2 }, { title: 'Before', numeric: true }, { title: 'After', numeric: true }, { title: 'Saved', numeric: true }]}
        rows={rows}
      />
    </Card>
  );
}

export function MarginsCard({ result, explorer }: { result: WhatIfResult; explorer: ExplorerData }) {
  const { spacing } = useTheme();
  const rise = result.worstRiseTime;
  return (
    <Card title="Margins" description={`${result.counts.pass} pass · ${result.counts.warn} warn · ${result.counts.fail} fail over the proposals switched on`} testID="explorer-margins">
      <View style={{ gap: spacing.md }}>
        <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
          <Text variant="bodyStrong">Worst rise time</Text>
          {rise ? (
            <>
              <Text variant="mono" testID="explorer-rise-time">
                {formatSi(rise.value, 's')} (limit {formatSi(rise.limit, 's')})
              </Text>
              <MarginBadge status={rise.status} testID="explorer-rise-status" />
            </>
          ) : (
            <Text tone="muted" testID="explorer-rise-time">
              No pulled-up line among the proposals switched on
            </Text>
          )}
        </View>
        {result.conflicts.length > 0 && (
          <Notice tone="warning" testID="explorer-conflicts" message={`${result.conflicts.length} pair(s) switched on change the same parts and cannot both be applied.`} />
        )}
        {result.proposals.map((p, pi) => {
          const info = explorer.proposals.find((e) => e.id === p.id);
          return (
            <View key={p.id} style={{ gap: spacing.sm, opacity: p.enabled ? 1 : 0.6 }} testID={`explorer-proposal-margins-${pi}`}>
              <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm }}>
                <Text variant="bodyStrong" style={{ flex: 1 }}>
                  {info?.title ?? p.id}
                </Text>
                <Text variant="caption" tone="muted">
                  {p.enabled ? 'on' : 'off'}
                </Text>
              </View>
              {p.margins.length === 0 && (
                <Text variant="caption" tone="muted">
                  No margin checks for this rewrite.
                </Text>
              )}
              {p.margins.map((m, mi) => {
                // "Higher is better" and "lower is better" both read as value against limit.
                const share = m.limit > 0 ? m.value / m.limit : 0;
                return (
                  <View key={mi} style={{ gap: spacing.xxs }}>
                    <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
                      <Text style={{ flex: 1, minWidth: 120 }}>{m.name}</Text>
                      <Text variant="mono">
                        {formatSi(m.value, m.unit)} / {formatSi(m.limit, m.unit)}
                      </Text>
                      <MarginBadge status={m.status} testID={`margin-badge-${pi}-${mi}`} />
                    </View>
                    <ProgressBar value={Math.min(1, share)} tone={m.status === 'pass' ? 'success' : m.status === 'warn' ? 'warning' : 'danger'} label={`${m.name}: ${formatSi(m.value, m.unit)} against a limit of ${formatSi(m.limit, m.unit)}, ${m.status}`} />
                    {!m.recomputed && (
                      <Text variant="caption" tone="faint">
                        As scanned (no inputs stored to recompute it).
                      </Text>
                    )}
                  </View>
                );
              })}
            </View>
          );
        })}
      </View>
    </Card>
  );
}
