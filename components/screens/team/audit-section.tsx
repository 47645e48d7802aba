// The team's audit log, newest first: who did what to whom, and when.
import { View } from 'react-native';
import { useAudit } from '@/components/data/use-audit';
import type { AuditEntry } from '@/components/data/types';
import { useTheme } from '@/components/theme/use-theme';
import { Card, EmptyState, ErrorState, Loading, Text } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';

function describe(entry: AuditEntry): string {
  const action = entry.action.replace(/[._-]+/g, ' ');
  return entry.target ? `${action} · ${entry.target}` : action;
}

export function AuditSection() {
  const { audit, error, isLoading, retry } = useAudit();
  const { spacing, colours, sizes } = useTheme();
  if (error) return <ErrorState error={error} onRetry={retry} />;
  if (isLoading || !audit) return <Loading label="Loading the audit log…" />;
  if (audit.entries.length === 0) {
    return <EmptyState icon="log" title="Nothing recorded yet" body="Sign-ins, invites, role changes, removals and password resets will be listed here." testID="audit-empty" />;
  }
  const entries = [...audit.entries].sort((a, b) => b.at.localeCompare(a.at));
  return (
    <Card padded={false} testID="audit-list">
      {entries.map((entry, i) => (
        <View
          key={entry.id}
          testID={`audit-entry-${i}`}
          style={{ flexDirection: 'row', gap: spacing.md, paddingVertical: spacing.md, paddingHorizontal: spacing.lg, borderBottomWidth: i === entries.length - 1 ? 0 : sizes.hairline, borderBottomColor: colours.border }}
        >
          <View style={{ flex: 1, gap: spacing.xxs }}>
            <Text variant="bodyStrong">{describe(entry)}</Text>
            <Text variant="caption" tone="muted">
              {entry.actor ?? 'No one signed in'}
            </Text>
          </View>
          <Text variant="caption" tone="faint">
            {formatDateTime(entry.at)}
          </Text>
        </View>
      ))}
    </Card>
  );
}
