// The explorer's pictures, fed by the in-browser what-if: the changed region of the proposals
// switched on drawn before and after, every margin against its limit per corner, and part counts
// before and after. Each picture carries a text alternative; they redraw as toggles and sliders move.
import { useMemo, useState } from 'react';
import { View, type LayoutChangeEvent } from 'react-native';
import Svg, { G, Rect, Text as SvgText } from 'react-native-svg';
import { BeforeAfterDrawing } from '@/components/drawing/before-after';
import { MarginsChart, type MarginPoint } from '@/components/charts/charts';
import { bandScale, valueScale } from '@/components/charts/chart-data';
import { useTheme } from '@/components/theme/use-theme';
import { Card, Text } from '@/components/ui';
import { changedRegionGraphs } from '@/optimizer/region/changed-region';
import { PART_ROWS } from './explorer-format';
import type { ExplorerData, ExplorerProposal, WhatIfResult } from '@/optimizer/whatif';

const LABEL = 96;

/** Part counts before and after the proposals switched on, one pair of bars per kind of part. */
export function WhatIfPartsChart({ result, testID = 'explorer-chart-parts' }: { result: WhatIfResult; testID?: string }) {
  const { colours, fonts, opacity, spacing, sizes } = useTheme();
  const [width, setWidth] = useState<number>(sizes.form);
  const { before, after } = result.parts;
  const rows = PART_ROWS.filter(([k]) => before[k] > 0 || after[k] > 0);
  const summary = rows.map(([k, label]) => `${label}: ${before[k]} before, ${after[k]} after`).join('; ') || 'No parts';
  const height = Math.max(40, rows.length * 34 + 20);
  const x = valueScale(rows.flatMap(([k]) => [before[k], after[k]]), Math.max(1, width - LABEL - 40));
  const y = bandScale(rows.map(([k]) => k), height - 20);
  const bar = y.bandwidth() / 2;
  return (
    <View testID={testID} style={{ gap: spacing.sm }}>
      <Text variant="label" tone="muted">Parts before and after the proposals switched on</Text>
      <View accessible accessibilityRole="image" accessibilityLabel={summary} testID={`${testID}-image`} onLayout={(e: LayoutChangeEvent) => setWidth(Math.max(sizes.control * 4, e.nativeEvent.layout.width))}>
        <Svg width={width} height={height}>
          {rows.map(([k, label]) => {
            const top = y(k) ?? 0;
            return (
              <G key={k} data-kind={k} data-before={String(before[k])} data-after={String(after[k])}>
                <SvgText x={0} y={top + bar + 4} fontSize={11} fontFamily={fonts.regular} fill={colours.text}>{label}</SvgText>
                <Rect x={LABEL} y={top} width={x(before[k])} height={bar} fill={colours.accent} opacity={opacity.faded} />
                <Rect x={LABEL} y={top + bar} width={x(after[k])} height={bar} fill={after[k] < before[k] ? colours.success : after[k] > before[k] ? colours.danger : colours.accent} />
                <SvgText x={LABEL + x(before[k]) + 4} y={top + bar - 2} fontSize={10} fontFamily={fonts.mono} fill={colours.textMuted}>{String(before[k])}</SvgText>
                <SvgText x={LABEL + x(after[k]) + 4} y={top + bar * 2 - 2} fontSize={10} fontFamily={fonts.mono} fill={colours.text}>{String(after[k])}</SvgText>
              </G>
            );
          })}
          <SvgText x={LABEL} y={height - 4} fontSize={10} fontFamily={fonts.regular} fill={colours.textMuted}>pale: before · solid: after</SvgText>
        </Svg>
      </View>
    </View>
  );
}

/** Margins of the proposals switched on, titled with their proposal so equal check names stay apart. */
export function whatIfMargins(result: WhatIfResult, explorer: ExplorerData): MarginPoint[] {
  return result.proposals.filter((p) => p.enabled).flatMap((p) => {
    const title = explorer.proposals.find((e) => e.id === p.id)?.title ?? p.id;
    return p.margins.map((m) => ({ name: `${title}: ${m.name}`, value: m.value, limit: m.limit, unit: m.unit, status: m.status, corner: m.corner }));
  });
}

/** Before/after drawing of some proposals' changed regions (one picture for all of them). */
export function RegionPicture({ proposals, testID, empty }: { proposals: ExplorerProposal[]; testID: string; empty: string }) {
  const key = proposals.map((p) => p.id).join('\n');
  // Keyed on the ids: a new graph object restarts the layout, so equal sets must reuse it.
  const graphs = useMemo(() => changedRegionGraphs(proposals.map((p) => p.region)), [key]);
  if (graphs.before.parts.length === 0 && graphs.after.parts.length === 0)
    return <Text tone="muted" testID={`${testID}-empty`}>{empty}</Text>;
  return (
    <BeforeAfterDrawing
      before={graphs.before}
      after={graphs.after}
      testID={testID}
      note="Only the changed parts are drawn; a net leaving the drawing goes on to the rest of the design."
    />
  );
}

export function ExplorerCharts({ explorer, result, testID = 'explorer' }: { explorer: ExplorerData; result: WhatIfResult; testID?: string }) {
  const { spacing } = useTheme();
  const margins = whatIfMargins(result, explorer);
  return (
    <Card title="Charts" description="Drawn from the what-if: they follow the proposals switched on and the sliders." testID={`${testID}-charts`}>
      <View style={{ gap: spacing.lg }}>
        <WhatIfPartsChart result={result} testID={`${testID}-chart-parts`} />
        {margins.length ? <MarginsChart margins={margins} testID={`${testID}-chart-margins`} /> : <Text tone="muted" testID={`${testID}-chart-margins-empty`}>No margin checks among the proposals switched on.</Text>}
      </View>
    </Card>
  );
}

export function ExplorerPictures({ explorer, result, enabled, testID = 'explorer' }: { explorer: ExplorerData; result: WhatIfResult; enabled: readonly string[]; testID?: string }) {
  const on = explorer.proposals.filter((p) => enabled.includes(p.id));
  return (
    <>
      <ExplorerCharts explorer={explorer} result={result} testID={testID} />
      <Card title="The change, drawn" description="The parts the proposals switched on remove, add or rewire." testID={`${testID}-drawing`}>
        <RegionPicture proposals={on} testID={`${testID}-region`} empty="Switch a proposal on to draw the parts it changes." />
      </Card>
    </>
  );
}
