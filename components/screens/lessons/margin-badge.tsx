// A margin status as a badge whose words say the status (colour is never the only sign).
import type { MarginStatus } from '@/optimizer/margins/corners';
import { Badge } from '@/components/ui';

const WORDS: Record<MarginStatus, { label: string; tone: 'success' | 'warning' | 'danger' }> = {
  pass: { label: 'Pass', tone: 'success' },
  warn: { label: 'Warn', tone: 'warning' },
  fail: { label: 'Fail', tone: 'danger' },
};

export function MarginBadge({ status, testID }: { status: MarginStatus; testID?: string }) {
  const w = WORDS[status];
  return <Badge label={w.label} tone={w.tone} testID={testID} />;
}
