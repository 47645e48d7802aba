// The waveform card of a proposal: the stimulus (default from the inputs and assumptions, editable
// as vectors or a clocked sequence), a button to simulate, and the before/after lanes.
import { useEffect, useState } from 'react';
import { View } from 'react-native';
import { Button, Text, TextField } from '@/components/ui';
import { useTheme } from '@/components/theme/use-theme';
import { errorSentence } from '@/components/data/error-sentences';
import { useRegionSimulation } from '@/components/data/use-region';
import { WaveformView } from './waveform-view';

export function WaveformPanel({ proposalId, defaultStimulus, inputs, testID = 'waveforms' }: { proposalId: string; defaultStimulus: string; inputs: string[]; testID?: string }) {
  const { spacing } = useTheme();
  const { result, error, busy, run } = useRegionSimulation(proposalId);
  const [text, setText] = useState(defaultStimulus);
  useEffect(() => {
    void run();
  }, [run]);
  return (
    <View style={{ gap: spacing.md }}>
      <Text variant="caption" tone="muted">
        {inputs.length
          ? `The default stimulus steps through ${inputs.join(', ')}, keeping to the design's assumptions. Edit it as one step a line (NAME=0 NAME=1), with "clock NAME" first for a clocked sequence.`
          : 'Nothing outside the region drives it; edit the stimulus to set its nets.'}
      </Text>
      <TextField label="Stimulus" testID={`${testID}-stimulus`} value={text} onChangeText={setText} multiline autoCapitalize="none" autoCorrect={false} error={error ? errorSentence(error) : undefined} />
      <View style={{ flexDirection: 'row', gap: spacing.sm, flexWrap: 'wrap' }}>
        <Button compact label="Simulate" testID={`${testID}-run`} accessibilityLabel="Simulate before and after with this stimulus" busy={busy} onPress={() => void run(text)} />
        <Button compact variant="secondary" label="Default stimulus" testID={`${testID}-reset`} accessibilityLabel="Go back to the default stimulus" onPress={() => { setText(defaultStimulus); void run(); }} />
      </View>
      {result ? <WaveformView sim={result} testID={testID} /> : null}
    </View>
  );
}
