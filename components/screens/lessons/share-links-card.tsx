// A published lesson's share links: create one (anyone with the link, or team members only; an
// optional expiry), see the new address once, and revoke links.
import { useState } from 'react';
import { View } from 'react-native';
import { useLessonActions, useShareLinks } from '@/components/data/use-lessons';
import { errorSentence } from '@/components/data/error-sentences';
import { useTheme } from '@/components/theme/use-theme';
import { Badge, Button, Card, ChoiceChips, ErrorState, Notice, Text, ToggleRow } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';

const EXPIRY = [
  { value: 'never', label: 'Never expires' },
  { value: '1', label: '1 day' },
  { value: '7', label: '7 days' },
  { value: '30', label: '30 days' },
] as const;
type Expiry = (typeof EXPIRY)[number]['value'];

export function ShareLinksCard({ lessonId, published }: { lessonId: string; published: boolean }) {
  const { spacing } = useTheme();
  const { links, error, retry } = useShareLinks(lessonId);
  const { share, revokeLink } = useLessonActions();
  const [anyone, setAnyone] = useState(true);
  const [expiry, setExpiry] = useState<Expiry>('never');
  const [made, setMade] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const create = async () => {
    setBusy(true);
    setProblem(null);
    try {
      const expiresAt = expiry === 'never' ? undefined : new Date(Date.now() + Number(expiry) * 86_400_000).toISOString();
      const link = await share(lessonId, { public: anyone, ...(expiresAt ? { expiresAt } : {}) });
      setMade(link.url);
    } catch (err) {
      setProblem(errorSentence(err));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Share links" description={published ? 'Read-only links to this lesson; nothing else of the team is reachable through them.' : 'Publish the lesson to share it.'} testID="share-links">
      <View style={{ gap: spacing.md }}>
        {published && (
          <>
            <ToggleRow label="Anyone with the link" description={anyone ? 'Opens signed out too.' : 'Only signed-in members of this team.'} value={anyone} onChange={setAnyone} testID="share-public" />
            <ChoiceChips label="Expiry" choices={EXPIRY} value={expiry} onChange={setExpiry} testID="share-expiry" />
            <View style={{ alignSelf: 'flex-start' }}>
              <Button label="Create a link" icon="plus" onPress={create} busy={busy} testID="share-create" />
            </View>
          </>
        )}
        {made && (
          <View style={{ gap: spacing.xs }}>
            <Notice tone="success" message="Link created. Copy it now: it is shown only once." testID="share-created" />
            <Text variant="mono" selectable testID="share-url">
              {made}
            </Text>
          </View>
        )}
        {problem && <Notice tone="warning" message={problem} testID="share-problem" />}
        {error ? <ErrorState error={error} onRetry={retry} testID="share-links-error" /> : null}
        {(links ?? []).map((l, i) => {
          const state = l.revokedAt ? 'Revoked' : l.expiresAt && new Date(l.expiresAt).getTime() < Date.now() ? 'Expired' : 'Active';
          return (
            <View key={l.id} testID={`share-link-${i}`} style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm, flexWrap: 'wrap' }}>
              <Badge label={state} tone={state === 'Active' ? 'success' : 'neutral'} />
              <Text style={{ flex: 1, minWidth: 160 }}>
                {l.public ? 'Anyone with the link' : 'Team members'} · made {formatDateTime(l.createdAt)}
                {l.expiresAt ? ` · until ${formatDateTime(l.expiresAt)}` : ''}
              </Text>
              {state === 'Active' && <Button label="Revoke" compact variant="danger" onPress={() => void revokeLink(lessonId, l.id)} testID={`share-revoke-${i}`} accessibilityLabel="Revoke this link" />}
            </View>
          );
        })}
      </View>
    </Card>
  );
}
