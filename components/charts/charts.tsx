// The four charts of the workflow screens, react-native-svg with d3 scales and theme colours only:
// board parts against budget (before and after accepted proposals), parts saved by rule, each
// margin against its limit at each corner, and part totals across revisions. Each has a text alternative.
import { View, type LayoutChangeEvent } from 'react-native';
import { useState, type ReactNode } from 'react';
import Svg, { Circle, G, Line, Path, Rect, Text as SvgText } from 'react-native-svg';
import { DataTable, Text } from '@/components/ui';
import { useTheme } from '@/components/theme/use-theme';
import { bandScale, marginPlace, savingsByRule, totalsLine, valueScale } from './chart-data';

const LABEL = 110;
const BAR = 14;

function ChartFrame({ title, summary, testID, children, table }: { title: string; summary: string; testID: string; children: (width: number) => ReactNode; table: ReactNode }) {
  const { spacing, sizes } = useTheme();
  const [width, setWidth] = useState<number>(sizes.form);
  return (
    <View testID={testID} style={{ gap: spacing.sm }}>
      <Text variant="label" tone="muted">{title}</Text>
      <View accessible accessibilityRole="image" accessibilityLabel={summary} onLayout={(e: LayoutChangeEvent) => setWidth(Math.max(sizes.control * 4, e.nativeEvent.layout.width))}>
        {children(width)}
      </View>
      {table}
    </View>
  );
}

export type BoardUse = { name: string; budget: { parts?: number | null }; usage: { before: { parts: number }; afterAccepted: { parts: number } } };

export function BudgetChart({ boards, testID = 'chart-budget' }: { boards: BoardUse[]; testID?: string }) {
  const { colours, fonts, opacity } = useTheme();
  const height = boards.length * (BAR * 2 + 12) + 20;
  const summary = boards.map((b) => `${b.name}: ${b.usage.before.parts} parts before, ${b.usage.afterAccepted.parts} after accepted proposals${b.budget.parts ? `, budget ${b.budget.parts}` : ''}`).join('; ');
  return (
    <ChartFrame
      title="Parts against budget, per board"
      summary={summary || 'No boards yet'}
      testID={testID}
      table={<DataTable testID={`${testID}-table`} caption="Parts against budget" columns={[{ title: 'Board', weight: 2 }, { title: 'Before', numeric: true }, { title: 'After accepted', numeric: true }, { title: 'Budget', numeric: true }]} rows={boards.map((b) => [b.name, String(b.usage.before.parts), String(b.usage.afterAccepted.parts), b.budget.parts ? String(b.budget.parts) : '—'])} />}
    >
      {(width) => {
        const x = valueScale(boards.flatMap((b) => [b.usage.before.parts, b.usage.afterAccepted.parts, b.budget.parts ?? 0]), width - LABEL - 40);
        return (
          <Svg width={width} height={height}>
            {boards.map((b, i) => {
              const top = i * (BAR * 2 + 12);
              const over = b.budget.parts ? b.usage.afterAccepted.parts > b.budget.parts : false;
              return (
                <G key={b.name} data-board={b.name}>
                  <SvgText x={0} y={top + BAR + 4} fontSize={11} fontFamily={fonts.regular} fill={colours.text}>{b.name}</SvgText>
                  <Rect x={LABEL} y={top} width={x(b.usage.before.parts)} height={BAR} fill={colours.accent} opacity={opacity.faded} />
                  <Rect x={LABEL} y={top + BAR + 2} width={x(b.usage.afterAccepted.parts)} height={BAR} fill={over ? colours.danger : colours.accent} />
                  <SvgText x={LABEL + x(b.usage.before.parts) + 4} y={top + BAR - 3} fontSize={10} fontFamily={fonts.mono} fill={colours.textMuted}>{String(b.usage.before.parts)}</SvgText>
                  <SvgText x={LABEL + x(b.usage.afterAccepted.parts) + 4} y={top + BAR * 2 - 1} fontSize={10} fontFamily={fonts.mono} fill={colours.text}>{String(b.usage.afterAccepted.parts)}</SvgText>
                  {b.budget.parts ? <Line x1={LABEL + x(b.budget.parts)} x2={LABEL + x(b.budget.parts)} y1={top - 2} y2={top + BAR * 2 + 4} stroke={colours.warning} strokeWidth={2} strokeDasharray="4 2" /> : null}
                </G>
              );
            })}
            <SvgText x={LABEL} y={height - 4} fontSize={10} fontFamily={fonts.regular} fill={colours.textMuted}>pale: before · solid: after accepted · dashed: budget</SvgText>
          </Svg>
        );
      }}
    </ChartFrame>
  );
}

export function SavingsByRuleChart({ proposals, testID = 'chart-savings' }: { proposals: { ruleId: string; status: string; savings: { parts: number } }[]; testID?: string }) {
  const { colours, fonts, opacity } = useTheme();
  const rows = savingsByRule(proposals);
  const height = Math.max(40, rows.length * 28 + 10);
  return (
    <ChartFrame
      title="Parts saved by rule"
      summary={rows.map((r) => `${r.ruleId}: ${r.accepted} accepted, ${r.open} open`).join('; ') || 'No proposals yet'}
      testID={testID}
      table={<DataTable testID={`${testID}-table`} caption="Parts saved by rule" columns={[{ title: 'Rule', weight: 2 }, { title: 'Accepted', numeric: true }, { title: 'Open', numeric: true }]} rows={rows.map((r) => [r.ruleId, String(r.accepted), String(r.open)])} />}
    >
      {(width) => {
        const x = valueScale(rows.map((r) => r.accepted + r.open), width - LABEL - 40);
        const y = bandScale(rows.map((r) => r.ruleId), height);
        return (
          <Svg width={width} height={height}>
            {rows.map((r) => (
              <G key={r.ruleId} data-rule={r.ruleId}>
                <SvgText x={0} y={(y(r.ruleId) ?? 0) + y.bandwidth() / 2 + 4} fontSize={10} fontFamily={fonts.mono} fill={colours.text}>{r.ruleId.length > 17 ? `${r.ruleId.slice(0, 16)}…` : r.ruleId}</SvgText>
                <Rect x={LABEL} y={y(r.ruleId)} width={x(r.accepted)} height={y.bandwidth()} fill={colours.success} />
                <Rect x={LABEL + x(r.accepted)} y={y(r.ruleId)} width={x(r.open)} height={y.bandwidth()} fill={colours.accent} opacity={opacity.faded * 2} />
                <SvgText x={LABEL + x(r.accepted + r.open) + 4} y={(y(r.ruleId) ?? 0) + y.bandwidth() / 2 + 4} fontSize={10} fontFamily={fonts.mono} fill={colours.textMuted}>{`${r.accepted}+${r.open}`}</SvgText>
              </G>
            ))}
          </Svg>
        );
      }}
    </ChartFrame>
  );
}

export type MarginPoint = { name: string; value: number; limit: number; unit: string; status: 'pass' | 'warn' | 'fail'; corner: { supply: number; resistors: string; beta?: number } };

const cornerWords = (c: MarginPoint['corner']) => `${c.supply} V, R ${c.resistors}${c.beta !== undefined ? `, β ${c.beta}` : ''}`;

export function MarginsChart({ margins, testID = 'chart-margins' }: { margins: MarginPoint[]; testID?: string }) {
  const { colours, fonts } = useTheme();
  const tone = (s: MarginPoint['status']) => (s === 'pass' ? colours.success : s === 'warn' ? colours.warning : colours.danger);
  const rowH = 26;
  const height = margins.length * rowH + 18;
  return (
    <ChartFrame
      title="Margins against their limits, per corner"
      summary={margins.map((m) => `${m.name} at ${cornerWords(m.corner)}: ${m.value} against ${m.limit} ${m.unit}, ${m.status}`).join('; ') || 'No margins'}
      testID={testID}
      table={null}
    >
      {(width) => {
        const axis = width - LABEL * 1.6;
        return (
          <Svg width={width} height={height}>
            <Line x1={LABEL * 1.6 + axis / 2} x2={LABEL * 1.6 + axis / 2} y1={0} y2={height - 14} stroke={colours.textMuted} strokeDasharray="3 3" />
            <SvgText x={LABEL * 1.6 + axis / 2} y={height - 2} fontSize={9} fontFamily={fonts.regular} fill={colours.textMuted} textAnchor="middle">limit</SvgText>
            {margins.map((m, i) => {
              const { at, clamped } = marginPlace(m.value, m.limit);
              const cy = i * rowH + rowH / 2;
              return (
                <G key={i} data-margin={m.name} data-status={m.status}>
                  <SvgText x={0} y={cy - 2} fontSize={10} fontFamily={fonts.regular} fill={colours.text}>{m.name.length > 26 ? `${m.name.slice(0, 25)}…` : m.name}</SvgText>
                  <SvgText x={0} y={cy + 9} fontSize={8} fontFamily={fonts.mono} fill={colours.textFaint}>{cornerWords(m.corner)}</SvgText>
                  <Line x1={LABEL * 1.6} x2={LABEL * 1.6 + axis} y1={cy} y2={cy} stroke={colours.border} />
                  <Circle cx={LABEL * 1.6 + at * axis} cy={cy} r={5} fill={tone(m.status)} stroke={clamped ? colours.text : tone(m.status)} />
                </G>
              );
            })}
          </Svg>
        );
      }}
    </ChartFrame>
  );
}

export function RevisionTotalsChart({ revisions, testID = 'chart-totals' }: { revisions: { number: number; partCounts: { total: number } }[]; testID?: string }) {
  const { colours, fonts } = useTheme();
  const pts = [...revisions].sort((a, b) => a.number - b.number).map((r) => ({ number: r.number, total: r.partCounts.total }));
  const height = 120;
  return (
    <ChartFrame
      title="Part totals across revisions"
      summary={pts.map((p) => `revision ${p.number}: ${p.total} parts`).join('; ') || 'No revisions'}
      testID={testID}
      table={null}
    >
      {(width) => {
        if (pts.length === 0) return null;
        const t = totalsLine(pts, width - 60, height - 30);
        return (
          <Svg width={width} height={height}>
            <G transform="translate(40 10)">
              <Line x1={0} x2={0} y1={0} y2={height - 30} stroke={colours.border} />
              <Line x1={0} x2={width - 60} y1={height - 30} y2={height - 30} stroke={colours.border} />
              <SvgText x={-4} y={4} fontSize={9} fontFamily={fonts.mono} fill={colours.textMuted} textAnchor="end">{String(t.max)}</SvgText>
              <Path d={t.path} stroke={colours.accent} strokeWidth={2} fill="none" />
              {t.points.map((p) => (
                <G key={p.number} data-revision={String(p.number)}>
                  <Circle cx={p.x} cy={p.y} r={4} fill={colours.accent} />
                  <SvgText x={p.x} y={p.y - 8} fontSize={9} fontFamily={fonts.mono} fill={colours.text} textAnchor="middle">{String(p.total)}</SvgText>
                  <SvgText x={p.x} y={height - 16} fontSize={9} fontFamily={fonts.regular} fill={colours.textMuted} textAnchor="middle">{`r${p.number}`}</SvgText>
                </G>
              ))}
            </G>
          </Svg>
        );
      }}
    </ChartFrame>
  );
}
