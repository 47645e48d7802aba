// Comments on a proposal: the thread, oldest first, and a box to add one.
import { useState } from 'react';
import { View } from 'react-native';
import { errorSentence } from '@/components/data/error-sentences';
import { useProposalActions } from '@/components/data/use-proposals';
import { useTheme } from '@/components/theme/use-theme';
import { Button, Card, Notice, Text, TextField } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import type { ProposalDetail } from '@/shared/api/proposals';

export function CommentsCard({ proposal, canComment }: { proposal: ProposalDetail; canComment: boolean }) {
  const { spacing, colours, sizes } = useTheme();
  const { comment } = useProposalActions();
  const [body, setBody] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function send() {
    if (!body.trim()) return;
    setBusy(true);
    setError(null);
    try {
      await comment(proposal.id, body.trim());
      setBody('');
    } catch (e) {
      setError(errorSentence(e));
    } finally {
      setBusy(false);
    }
  }

  return (
    <Card title="Comments" testID="proposal-comments">
      {proposal.comments.length === 0 ? <Text tone="muted">No comments yet.</Text> : null}
      {proposal.comments.map((c, i) => (
        <View key={c.id} testID={`proposal-comment-${i}`} style={{ gap: spacing.xxs, paddingBottom: spacing.sm, borderBottomWidth: sizes.hairline, borderBottomColor: colours.border }}>
          <Text variant="label">
            {c.author}{' '}
            <Text variant="caption" tone="faint">
              · {formatDateTime(c.createdAt)}
            </Text>
          </Text>
          <Text>{c.body}</Text>
        </View>
      ))}
      {error ? <Notice tone="warning" message={error} /> : null}
      {canComment ? (
        <View style={{ gap: spacing.sm }}>
          <TextField label="Add a comment" testID="proposal-comment-body" value={body} onChangeText={setBody} multiline />
          <View style={{ alignSelf: 'flex-start' }}>
            <Button label="Post comment" variant="secondary" compact onPress={() => void send()} busy={busy} disabled={!body.trim()} testID="proposal-comment-send" />
          </View>
        </View>
      ) : null}
    </Card>
  );
}
