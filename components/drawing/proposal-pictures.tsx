// The pictures card of a proposal: the changed region drawn before and after, its waveforms on the
// same stimulus, and its margins against their limits at each corner.
import { Card, ErrorState, Loading, Text } from '@/components/ui';
import { useProposalRegion } from '@/components/data/use-region';
import { MarginsChart, type MarginPoint } from '@/components/charts/charts';
import { WaveformPanel } from '@/components/waveforms/waveform-panel';
import { BeforeAfterDrawing } from './before-after';

export function ProposalPictures({ proposal }: { proposal: { id: string; margins: MarginPoint[] } }) {
  const { region, error, isLoading, retry } = useProposalRegion(proposal.id);
  return (
    <>
      <Card title="The change, drawn" testID="proposal-drawing">
        {error ? (
          <ErrorState error={error} onRetry={retry} testID="proposal-drawing-error" />
        ) : isLoading || !region ? (
          <Loading label="Drawing the changed region…" testID="proposal-drawing-loading" />
        ) : (
          <BeforeAfterDrawing
            before={region.before}
            after={region.after}
            testID="region-drawing"
            note={region.ringTruncated ? `${region.ringTruncated} more neighbouring parts are left out of the drawing.` : 'Parts sharing a net with the change are drawn as neighbours; rails are drawn as supply and ground symbols.'}
          />
        )}
      </Card>
      {proposal.margins.length ? (
        <Card title="Margins, charted" testID="proposal-margins-chart">
          <MarginsChart margins={proposal.margins} />
        </Card>
      ) : null}
      <Card title="Waveforms before and after" testID="proposal-waveforms">
        {region ? (
          <WaveformPanel proposalId={proposal.id} defaultStimulus={region.stimulus} inputs={region.inputs} />
        ) : (
          <Text tone="muted">The waveforms follow once the region is drawn.</Text>
        )}
      </Card>
    </>
  );
}
