// Before/after waveforms of a region: one lane per net with the before trace above the after trace
// on one time axis, 0/1 as lines, Z dashed at mid level, X as a hatched band, and the first step
// where they differ marked. A table of the same values is the text alternative.
import { useId, useState } from 'react';
import { ScrollView, View } from 'react-native';
import Svg, { Defs, G, Line, Path, Pattern, Polyline, Rect, Text as SvgText } from 'react-native-svg';
import { Button, DataTable, Text } from '@/components/ui';
import { useTheme } from '@/components/theme/use-theme';
import type { RegionSimulation } from '@/shared/api/pictures';
import type { Level } from '@/optimizer/verify/switch-sim';
import { levelText, waveShapes } from './wave-shapes';

const LABEL = 120;
const STEP = 28;
const ROW = 14;
const ROW_GAP = 4;
const LANE_GAP = 10;
const RULER = 18;

function Trace({ levels, top, ink, hatch, testID }: { levels: Level[]; top: number; ink: { line: string; x: string; z: string }; hatch: string; testID: string }) {
  const s = waveShapes(levels, STEP, top, ROW);
  return (
    <G data-trace={testID}>
      {s.x.map((b, i) => (
        <Rect key={`x${i}`} x={LABEL + b.x1} y={b.top} width={b.x2 - b.x1} height={b.bottom - b.top} fill={`url(#${hatch})`} stroke={ink.x} strokeWidth={1} data-level="X" />
      ))}
      {s.z.map((z, i) => (
        <Line key={`z${i}`} x1={LABEL + z.x1} y1={z.y} x2={LABEL + z.x2} y2={z.y} stroke={ink.z} strokeWidth={1.5} strokeDasharray="4 3" data-level="Z" />
      ))}
      {s.logic.map((run, i) => (
        <Polyline key={`l${i}`} points={run.map((p) => `${LABEL + p.x},${p.y}`).join(' ')} fill="none" stroke={ink.line} strokeWidth={1.5} />
      ))}
    </G>
  );
}

export function WaveformView({ sim, testID = 'waveforms' }: { sim: RegionSimulation; testID?: string }) {
  const { colours, fonts, spacing } = useTheme();
  const [table, setTable] = useState(false);
  const hatch = `hatch-${useId().replace(/[^a-zA-Z0-9]/g, '')}`;
  const laneHeight = ROW * 2 + ROW_GAP + LANE_GAP;
  const width = LABEL + sim.steps * STEP + spacing.md;
  const height = RULER + sim.lanes.length * laneHeight;
  const diff = sim.firstDifference;
  const summary = diff
    ? `Waveforms over ${sim.steps} steps: before and after first differ at step ${diff.step + 1} on ${diff.nets.join(', ')}`
    : `Waveforms over ${sim.steps} steps: before and after agree on every net shown`;
  return (
    <View testID={testID} style={{ gap: spacing.sm }}>
      <Text variant="body" tone={diff ? 'danger' : 'success'} testID={`${testID}-summary`}>{summary}</Text>
      <ScrollView horizontal accessible accessibilityRole="image" accessibilityLabel={summary}>
        <Svg width={width} height={height} testID={`${testID}-svg`}>
          <Defs>
            <Pattern id={hatch} patternUnits="userSpaceOnUse" width={6} height={6} patternTransform="rotate(45)">
              <Rect x={0} y={0} width={6} height={6} fill={colours.dangerSoft} />
              <Line x1={0} y1={0} x2={0} y2={6} stroke={colours.danger} strokeWidth={2} />
            </Pattern>
          </Defs>
          {Array.from({ length: sim.steps }, (_, k) => (
            <G key={k}>
              <Line x1={LABEL + k * STEP} y1={RULER - 4} x2={LABEL + k * STEP} y2={height} stroke={colours.border} strokeWidth={0.5} />
              <SvgText x={LABEL + k * STEP + STEP / 2} y={RULER - 6} fontSize={9} fontFamily={fonts.mono} fill={colours.textFaint} textAnchor="middle">{String(k + 1)}</SvgText>
            </G>
          ))}
          {sim.lanes.map((lane, i) => {
            const top = RULER + i * laneHeight;
            const ink = { line: colours.text, x: colours.danger, z: colours.textMuted };
            return (
              <G key={lane.net} data-lane={lane.net}>
                <SvgText x={0} y={top + ROW} fontSize={10} fontFamily={fonts.mono} fill={lane.role === 'input' ? colours.accent : colours.text}>{lane.net.length > 16 ? `…${lane.net.slice(-15)}` : lane.net}</SvgText>
                <SvgText x={LABEL - 6} y={top + ROW - 3} fontSize={8} fontFamily={fonts.regular} fill={colours.textFaint} textAnchor="end">before</SvgText>
                <SvgText x={LABEL - 6} y={top + ROW * 2 + ROW_GAP - 3} fontSize={8} fontFamily={fonts.regular} fill={colours.textFaint} textAnchor="end">after</SvgText>
                {lane.before ? <Trace levels={lane.before} top={top} ink={ink} hatch={hatch} testID={`${lane.net}:before`} /> : null}
                {lane.after ? <Trace levels={lane.after} top={top + ROW + ROW_GAP} ink={{ ...ink, line: lane.firstDifference !== undefined ? colours.danger : colours.success }} hatch={hatch} testID={`${lane.net}:after`} /> : null}
              </G>
            );
          })}
          {diff ? (
            <G data-first-difference={String(diff.step)}>
              <Rect x={LABEL + diff.step * STEP} y={RULER - 4} width={STEP} height={height - RULER + 4} fill={colours.danger} opacity={0.08} />
              <Path d={`M${LABEL + diff.step * STEP} ${RULER - 4} V${height}`} stroke={colours.danger} strokeWidth={1.5} strokeDasharray="3 2" />
            </G>
          ) : null}
        </Svg>
      </ScrollView>
      <Text variant="caption" tone="muted">0 low · 1 high · dashed mid line: Z (not driven) · hatched red band: X (unknown or fought over)</Text>
      <Button compact variant="ghost" testID={`${testID}-table-toggle`} label={table ? 'Hide the values table' : 'Show the values as a table'} accessibilityLabel={table ? 'Hide the waveform values table' : 'Show the waveform values as a table'} onPress={() => setTable((t) => !t)} />
      {table ? (
        <DataTable
          testID={`${testID}-table`}
          caption="Waveform values per net, before and after"
          columns={[{ title: 'Net', weight: 2 }, { title: 'Before', weight: 3 }, { title: 'After', weight: 3 }, { title: 'First difference', weight: 1 }]}
          rows={sim.lanes.map((l) => [l.net, (l.before ?? []).map(levelText).join(' ') || 'not present', (l.after ?? []).map(levelText).join(' ') || 'not present', l.firstDifference !== undefined ? `step ${l.firstDifference + 1}` : '—'])}
        />
      ) : null}
    </View>
  );
}
