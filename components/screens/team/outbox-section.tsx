// Mail the product has sent, as captured by the local fake SMTP server; nothing leaves the machine.
import { useState } from 'react';
import { View } from 'react-native';
import { useOutbox } from '@/components/data/use-outbox';
import { TwoPane } from '@/components/navigation/two-pane';
import { useTheme } from '@/components/theme/use-theme';
import { Card, EmptyState, ErrorState, ListRow, Loading, Notice, Text } from '@/components/ui';
import { formatDateTime } from '@/components/screens/common/format';
import type { OutboxMessage } from '@/components/data/types';

export function OutboxSection() {
  const { outbox, error, isLoading, retry } = useOutbox();
  const { spacing } = useTheme();
  const [selected, setSelected] = useState<string | null>(null);

  if (error) return <ErrorState error={error} onRetry={retry} />;
  if (isLoading || !outbox) return <Loading label="Loading the outbox…" />;

  const intro = <Notice tone="info" message="Mail is captured by the local mail server in development and tests; nothing here has left this machine." />;
  if (outbox.messages.length === 0) {
    return (
      <View style={{ gap: spacing.lg }}>
        {intro}
        <EmptyState icon="mail" title="No mail yet" body="Invites and password reset e-mails will appear here as soon as they are sent." testID="outbox-empty" />
      </View>
    );
  }

  const messages = [...outbox.messages].sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
  const message = messages.find((m) => m.id === selected) ?? null;
  return (
    <View style={{ gap: spacing.lg }}>
      {intro}
      <TwoPane
        testID="outbox"
        list={
          <Card padded={false} testID="outbox-list">
            {messages.map((m, i) => (
              <ListRow
                key={m.id}
                testID={`outbox-message-${i}`}
                title={m.subject}
                subtitle={`To ${m.to}`}
                meta={formatDateTime(m.receivedAt)}
                onPress={() => setSelected(m.id)}
                selected={m.id === selected}
                accessibilityLabel={`${m.subject}, to ${m.to}`}
                last={i === messages.length - 1}
              />
            ))}
          </Card>
        }
        detail={message ? <MessageView message={message} /> : null}
        placeholder={<EmptyState icon="mail" title="Choose a message" body="Pick a message on the left to read it." testID="outbox-placeholder" />}
        onBack={() => setSelected(null)}
        backLabel="All mail"
      />
    </View>
  );
}

function MessageView({ message }: { message: OutboxMessage }) {
  const { spacing, colours, radii } = useTheme();
  return (
    <Card testID="outbox-message">
      <View style={{ gap: spacing.xxs }}>
        <Text variant="title">{message.subject}</Text>
        <Text variant="caption" tone="muted">
          To {message.to} · {formatDateTime(message.receivedAt)}
        </Text>
      </View>
      <View style={{ backgroundColor: colours.surfaceMuted, borderRadius: radii.md, padding: spacing.md }}>
        <Text variant="mono" selectable testID="outbox-message-text">
          {message.text}
        </Text>
      </View>
    </Card>
  );
}
