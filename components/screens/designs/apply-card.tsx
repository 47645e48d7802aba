// Applying the accepted proposals of the latest revision as a new revision (designers and admins).
// A conflict (the revision moved on, overlapping proposals) is shown as a sentence; nothing changes.
import { useState } from 'react';
import { View } from 'react-native';
import { ApiError } from '@/components/data/api-error';
import { errorSentence } from '@/components/data/error-sentences';
import { useDesignActions } from '@/components/data/use-designs';
import { useProposals } from '@/components/data/use-proposals';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, Notice, Text } from '@/components/ui';
import { savingsPhrase } from '@/components/screens/proposals/labels';
import type { DesignDetail } from '@/shared/api/designs';
import type { ProposalSummary } from '@/shared/api/proposals';

function conflictSentence(error: unknown, accepted: readonly ProposalSummary[]): string {
  const base = errorSentence(error);
  if (error instanceof ApiError && error.code === 'proposals-overlap' && error.details && typeof error.details === 'object') {
    const pairs = (error.details as { pairs?: unknown }).pairs;
    const title = (id: unknown) => accepted.find((p) => p.id === id)?.title ?? 'another proposal';
    if (Array.isArray(pairs) && pairs.length) {
      const named = pairs.slice(0, 3).map((pair) => (Array.isArray(pair) ? `“${title(pair[0])}” and “${title(pair[1])}”` : '')).filter(Boolean);
      if (named.length) return `${base} Overlapping: ${named.join('; ')}.`;
    }
  }
  return base;
}

export function ApplyCard({ design }: { design: DesignDetail }) {
  const { spacing } = useTheme();
  const latest = design.revisions[design.revisions.length - 1];
  const { proposals } = useProposals(design.id, { status: 'accepted' });
  const { applyAccepted } = useDesignActions();
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<{ tone: 'success' | 'warning'; message: string } | null>(null);
  const accepted = (proposals ?? []).filter((p) => p.revision === latest?.number);

  async function apply() {
    if (!latest) return;
    setBusy(true);
    setResult(null);
    try {
      const rev = await applyAccepted(design.id, accepted.map((p) => p.id), latest.number);
      setResult({ tone: 'success', message: `Revision ${rev.number} made with ${accepted.length} accepted proposal${accepted.length === 1 ? '' : 's'}: ${rev.partCounts.total} parts.` });
    } catch (e) {
      setResult({ tone: 'warning', message: conflictSentence(e, accepted) });
    } finally {
      setBusy(false);
    }
  }

  const total = accepted.reduce((n, p) => n + p.savings.parts, 0);
  return (
    <Card title="Apply accepted proposals" description="Makes a new revision with the accepted rewrites; the current revision stays as it was." testID="apply-card">
      {result ? <Notice tone={result.tone} message={result.message} testID="apply-result" /> : null}
      {accepted.length === 0 ? (
        <Text tone="muted" testID="apply-none">
          No accepted proposals on revision {latest?.number ?? '–'} yet. Reviewers accept them from the sign-off queue.
        </Text>
      ) : (
        <View style={{ gap: spacing.sm }}>
          {accepted.map((p) => (
            <Text key={p.id} testID={`apply-item-${p.id}`}>
              • {p.title} <Text tone="muted">(saves {savingsPhrase(p.savings)})</Text>
            </Text>
          ))}
          <View style={{ alignSelf: 'flex-start' }}>
            <Button label={`Apply ${accepted.length} accepted · −${total} parts`} icon="check" onPress={() => void apply()} busy={busy} testID="apply-submit" accessibilityLabel={`Apply ${accepted.length} accepted proposals to revision ${latest?.number}`} />
          </View>
        </View>
      )}
    </Card>
  );
}
