// The trade-off explorer: switch each proposal on or off and move the sliders; part counts, cost,
// every margin and the worst rise time recompute in the browser with the engine's own what-if
// code, and the charts and before/after drawing redraw with them. Nothing here is saved: a what-if never changes the stored design.
import { useState } from 'react';
import { View } from 'react-native';
import type { ExplorerData, SettingKey, WhatIfSettings } from '@/optimizer/whatif';
import { useWhatIf } from '@/components/data/use-lessons';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, Notice, Text, ToggleRow } from '@/components/ui';
import { Slider } from '@/components/ui/slider';
import { formatSetting, SETTING_LABELS, SETTING_ORDER } from './explorer-format';
import { ExplorerPictures } from './explorer-pictures';
import { MarginsCard, PartsCard } from './explorer-results';
import { TwoLevelSide } from './two-level-side';

const WIDE_EXPLORER = 820;
const VERDICT_WORDS = { proved: 'proved equivalent', refuted: 'not equivalent', unverified: 'not verified' } as const;

export function TradeOffExplorer({ explorer, testID = 'explorer' }: { explorer: ExplorerData; testID?: string }) {
  const { spacing } = useTheme();
  // Side by side when the explorer itself has room (it sits in panes of different widths).
  const [width, setWidth] = useState(0);
  const wide = width >= WIDE_EXPLORER;
  const [enabled, setEnabled] = useState<string[]>(() => explorer.proposals.map((p) => p.id));
  // Only the settings the learner moved go to the engine; the rest keep each margin's scanned figure.
  const [moved, setMoved] = useState<WhatIfSettings>({});
  const { result, error } = useWhatIf(explorer, moved, enabled);
  const { settings: scanned, ranges } = explorer.defaults;

  const valueOf = (k: SettingKey) => moved[k] ?? scanned[k] ?? ranges[k].min;
  const toggle = (id: string, on: boolean) => setEnabled((list) => (on ? explorer.proposals.map((p) => p.id).filter((x) => x === id || list.includes(x)) : list.filter((x) => x !== id)));

  const controls = (
    <View style={{ gap: spacing.lg }}>
      <Card title="Proposals" description="Switch a rewrite off to see the design without it." testID={`${testID}-proposals`}>
        <View style={{ gap: spacing.md }}>
          {explorer.proposals.length === 0 && <Text tone="muted">This lesson has no proposals chosen.</Text>}
          {explorer.proposals.map((p, i) => (
            <ToggleRow
              key={p.id}
              label={p.title}
              description={`${p.ruleId} · ${VERDICT_WORDS[p.verdict]}`}
              value={enabled.includes(p.id)}
              onChange={(on) => toggle(p.id, on)}
              testID={`${testID}-toggle-${i}`}
            />
          ))}
        </View>
      </Card>
      <Card title="Settings" description="Start at the scanned figures. Settings no margin uses change nothing." testID={`${testID}-settings`}>
        <View style={{ gap: spacing.lg }}>
          {SETTING_ORDER.map((k) => (
            <Slider
              key={k}
              label={SETTING_LABELS[k].label}
              value={valueOf(k)}
              min={ranges[k].min}
              max={ranges[k].max}
              step={ranges[k].step}
              // A setting no stored margin uses reads so until it is moved (it changes nothing).
              format={(v) => (moved[k] === undefined && scanned[k] === undefined ? 'not used here' : formatSetting(k, v))}
              onChange={(v) => setMoved((m) => ({ ...m, [k]: v }))}
              testID={`${testID}-slider-${k}`}
            />
          ))}
          <View style={{ alignSelf: 'flex-start' }}>
            <Button label="Back to the scanned figures" variant="secondary" compact icon="back" onPress={() => setMoved({})} testID={`${testID}-reset`} disabled={Object.keys(moved).length === 0} />
          </View>
        </View>
      </Card>
    </View>
  );

  const results = (
    <View style={{ gap: spacing.lg }}>
      <Notice tone="info" testID={`${testID}-whatif-note`} message="A what-if only: these figures are worked out in your browser and never change the stored design." />
      {error && <Notice tone="warning" testID={`${testID}-error`} message={`These settings cannot be worked out: ${error}`} />}
      {result && <MarginsCard result={result} explorer={explorer} />}
      {result && <PartsCard result={result} explorer={explorer} />}
      {result && <ExplorerPictures explorer={explorer} result={result} enabled={enabled} testID={testID} />}
    </View>
  );

  const twoLevel = explorer.proposals.filter((p) => p.twoLevel);
  return (
    <View testID={testID} style={{ gap: spacing.lg }} onLayout={(e) => setWidth(e.nativeEvent.layout.width)}>
      <View style={{ flexDirection: wide ? 'row' : 'column', gap: spacing.lg, alignItems: wide ? 'flex-start' : 'stretch' }}>
        <View style={{ flex: wide ? 2 : undefined, minWidth: 0 }}>{controls}</View>
        <View style={{ flex: wide ? 3 : undefined, minWidth: 0 }}>{results}</View>
      </View>
      {twoLevel.map((p, i) => (
        <TwoLevelSide key={p.id} view={p.twoLevel!} assumptions={p.evidence.assumptions} testID={`${testID}-two-level-${i}`} />
      ))}
      {explorer.cautions.length > 0 && (
        <Card title="Before you build it" testID={`${testID}-cautions`}>
          <View style={{ gap: spacing.xs }}>
            {explorer.cautions.map((c, i) => (
              <Text key={i} variant="caption" tone="muted">
                {c}
              </Text>
            ))}
          </View>
        </Card>
      )}
    </View>
  );
}
