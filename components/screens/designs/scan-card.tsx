// The design's latest scan: start one, watch its stage and progress while a worker runs it
// (polled only while it is queued or running), cancel it, and read what it found.
import { useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { isLive, useScan, useScanActions } from '@/components/data/use-scans';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, Notice, ProgressBar, Text } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import { SCAN_WORDS, stageLabel } from '@/components/screens/proposals/labels';
import type { DesignDetail } from '@/shared/api/designs';

export function ScanCard({ design, canScan, onOpenProposals }: { design: DesignDetail; canScan: boolean; onOpenProposals: () => void }) {
  const { spacing } = useTheme();
  const { start, cancel } = useScanActions();
  const [scanId, setScanId] = useState<string | null>(null);
  const id = scanId ?? design.latestScan?.id ?? null;
  const { scan } = useScan(id, scanId ? null : design.latestScan);
  const [busy, setBusy] = useState<'start' | 'cancel' | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const latest = design.revisions[design.revisions.length - 1];
  const live = isLive(scan);

  async function run(action: 'start' | 'cancel') {
    setBusy(action);
    setProblem(null);
    try {
      if (action === 'start') setScanId((await start(design.id, { revision: latest?.number })).id);
      else if (scan) await cancel(scan);
    } catch (e) {
      setProblem(errorSentence(e));
    } finally {
      setBusy(null);
    }
  }

  const word = scan ? SCAN_WORDS[scan.status] : null;
  return (
    <Card title="Scan" description="Runs every rule over the latest revision, proves each rewrite and checks its margins." testID="scan-card">
      {problem ? <Notice tone="warning" message={problem} testID="scan-problem" /> : null}
      {!scan ? (
        <Text tone="muted" testID="scan-none">
          This design has not been scanned yet.
        </Text>
      ) : (
        <View style={{ gap: spacing.sm }} testID="scan-status" accessibilityLiveRegion="polite">
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
            <Badge label={word!.label} tone={word!.tone} testID={`scan-state-${scan.status}`} />
            <Text variant="caption" tone="muted">
              Revision {scan.revision} · started by {scan.startedBy} · {formatDateTime(scan.createdAt)}
            </Text>
          </View>
          {live ? (
            <>
              <View style={{ flexDirection: 'row', justifyContent: 'space-between', gap: spacing.sm }}>
                <Text variant="label" testID="scan-stage">
                  {scan.status === 'queued' ? word!.sentence : stageLabel(scan.stage)}
                </Text>
                <Text variant="mono" testID="scan-progress">
                  {Math.round(scan.progress)}%
                </Text>
              </View>
              <ProgressBar value={scan.progress / 100} label={`Scan progress ${Math.round(scan.progress)} percent`} testID="scan-progress-bar" />
              {scan.cancelRequested ? <Text variant="caption" tone="muted">Cancelling: the worker stops at the next stage.</Text> : null}
            </>
          ) : scan.status === 'done' ? (
            <Text testID="scan-result">
              Found {scan.proposalCount} proposal{scan.proposalCount === 1 ? '' : 's'}
              {scan.finishedAt && scan.startedAt ? ` in ${((Date.parse(scan.finishedAt) - Date.parse(scan.startedAt)) / 1000).toFixed(1)} s` : ''}.
            </Text>
          ) : (
            <Text tone={scan.status === 'failed' ? 'danger' : 'muted'} testID="scan-result">
              {word!.sentence}
              {scan.error ? ` ${scan.error}` : ''}
            </Text>
          )}
          {scan.ruleErrors.length > 0 ? (
            <Notice tone="warning" message={`${scan.ruleErrors.length} rule${scan.ruleErrors.length === 1 ? '' : 's'} could not finish: ${scan.ruleErrors.map((r) => `${r.ruleId} (${r.message})`).join('; ')}. The other rules' proposals stand.`} />
          ) : null}
        </View>
      )}
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.sm }}>
        {canScan && !live ? (
          <Button label={scan ? 'Scan again' : 'Start a scan'} icon="scan" onPress={() => void run('start')} busy={busy === 'start'} testID="scan-start" accessibilityLabel={`Scan revision ${latest?.number ?? ''}`} />
        ) : null}
        {canScan && live ? <Button label="Cancel scan" variant="danger" icon="close" onPress={() => void run('cancel')} busy={busy === 'cancel'} disabled={scan?.cancelRequested} testID="scan-cancel" /> : null}
        {scan?.status === 'done' ? <Button label="Read the proposals" variant="secondary" icon="forward" onPress={onOpenProposals} testID="scan-open-proposals" /> : null}
      </View>
    </Card>
  );
}
