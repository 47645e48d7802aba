// Side by side for a two-level rewrite: the truth table, the Karnaugh map (up to 4 inputs) with the
// don't-cares the assumptions create marked "–", and the minimised cover the scan chose.
import { View } from 'react-native';
import type { TwoLevelView } from '@/optimizer/whatif';
import { useTheme } from '@/components/theme/use-theme';
import { useLayoutSize } from '@/components/theme/use-layout';
import { Card, DataTable, Text } from '@/components/ui';

const MAP_LIMIT = 4;

function cellText(row: TwoLevelView['rows'][number] | undefined): string {
  if (!row) return '';
  return row.excludedBy.length ? '–' : String(row.before);
}

export function KarnaughMap({ view, testID }: { view: TwoLevelView; testID: string }) {
  const { colours, spacing, sizes, fonts, type } = useTheme();
  const map = view.map;
  if (!map) return null;
  const nCol = map.colVars.length;
  const bits = (v: number, n: number) => v.toString(2).padStart(n, '0');
  const cell = { width: sizes.controlCompact + spacing.lg, height: sizes.controlCompact, alignItems: 'center', justifyContent: 'center', borderWidth: sizes.hairline, borderColor: colours.border } as const;
  return (
    <View testID={testID} accessibilityLabel={`Map of ${view.output}: rows ${map.rowVars.join('')}, columns ${map.colVars.join('')}; dashes are don't-cares`}>
      <View style={{ flexDirection: 'row' }}>
        <View style={[cell, { borderColor: colours.transparent }]}>
          <Text variant="caption" tone="muted">
            {map.rowVars.join('')}\{map.colVars.join('')}
          </Text>
        </View>
        {map.colOrder.map((c) => (
          <View key={c} style={[cell, { backgroundColor: colours.surfaceMuted }]}>
            <Text variant="mono">{bits(c, nCol)}</Text>
          </View>
        ))}
      </View>
      {map.rowOrder.map((r) => (
        <View key={r} style={{ flexDirection: 'row' }}>
          <View style={[cell, { backgroundColor: colours.surfaceMuted }]}>
            <Text variant="mono">{bits(r, map.rowVars.length)}</Text>
          </View>
          {map.colOrder.map((c) => {
            const row = view.rows[(r << nCol) | c];
            const dc = !!row?.excludedBy.length;
            return (
              <View key={c} style={[cell, { backgroundColor: dc ? colours.warningSoft : row?.cover ? colours.accentSoft : colours.surface }]}>
                <Text style={{ fontFamily: fonts.mono, fontSize: type.mono.fontSize }} tone={dc ? 'warning' : 'default'}>
                  {cellText(row)}
                </Text>
              </View>
            );
          })}
        </View>
      ))}
    </View>
  );
}

/** `assumptions` names each assumption id by its expression, so a don't-care says why in words. */
export function TwoLevelSide({ view, testID, assumptions = [] }: { view: TwoLevelView; testID: string; assumptions?: { id: string; expression: string }[] }) {
  const named = new Map(assumptions.map((a) => [a.id, a.expression]));
  const { spacing } = useTheme();
  const wide = useLayoutSize() === 'wide';
  const showMap = view.map !== null && view.inputs.length <= MAP_LIMIT;
  const hasAfter = view.rows.some((r) => r.after !== undefined);
  const columns = [
    ...view.inputs.map((n) => ({ title: n })),
    // Short headings: seven columns must fit a phone.
    { title: 'Was' },
    { title: 'Cover' },
    ...(hasAfter ? [{ title: 'Now' }] : []),
    { title: 'Don’t-care: breaks', weight: 2.5 },
  ];
  const rows = view.rows.map((r) => [
    ...r.bits.map(String),
    String(r.before),
    String(r.cover),
    ...(hasAfter ? [r.after === undefined ? '' : String(r.after)] : []),
    r.excludedBy.map((id) => named.get(id) ?? id).join(', '),
  ]);
  return (
    <Card title={`Where the saving comes from: ${view.output}`} description={`${view.dontCares} of ${view.rows.length} input combinations are don't-cares under the assumptions.`} testID={testID}>
      <View style={{ gap: spacing.lg }}>
        <View style={{ gap: spacing.xs }}>
          <Text variant="label">Minimised cover ({view.cover.source === 'scan' ? 'as the scan chose it' : 'recomputed'})</Text>
          <Text variant="mono" testID={`${testID}-cover`}>
            {view.output} = {view.cover.text || '0'}
          </Text>
        </View>
        <View style={{ flexDirection: wide ? 'row' : 'column', gap: spacing.lg, alignItems: 'flex-start' }}>
          {showMap && <KarnaughMap view={view} testID={`${testID}-map`} />}
          <View style={{ flex: wide ? 1 : undefined, alignSelf: 'stretch', minWidth: 0 }}>
            <DataTable testID={`${testID}-table`} caption={`Truth table of ${view.output}`} columns={columns} rows={rows} />
          </View>
        </View>
      </View>
    </Card>
  );
}
