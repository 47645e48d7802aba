// Which e-mails the person wants; each switch saves as soon as it changes.
import { useState } from 'react';
import { errorSentence } from '@/components/data/error-sentences';
import { useAccountActions } from '@/components/data/use-account';
import type { AccountView, NotificationPrefs } from '@/components/data/types';
import { Card, Notice, ToggleRow } from '@/components/ui';

export function NotificationsCard({ account }: { account: AccountView }) {
  const { update } = useAccountActions();
  const [saving, setSaving] = useState<keyof NotificationPrefs | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function toggle(key: keyof NotificationPrefs, value: boolean) {
    setSaving(key);
    setError(null);
    try {
      await update({ notifications: { ...account.notifications, [key]: value } });
    } catch (e) {
      setError(errorSentence(e));
    } finally {
      setSaving(null);
    }
  }

  return (
    <Card title="E-mail notifications">
      {error ? <Notice tone="warning" message={error} testID="notifications-error" /> : null}
      <ToggleRow
        label="Review requests"
        description="When a proposal is waiting for your decision."
        value={account.notifications.reviewRequests}
        disabled={saving !== null}
        onChange={(v) => toggle('reviewRequests', v)}
        testID="notify-review-requests"
      />
      <ToggleRow
        label="Decisions"
        description="When a reviewer accepts or rejects a proposal from your scan."
        value={account.notifications.decisions}
        disabled={saving !== null}
        onChange={(v) => toggle('decisions', v)}
        testID="notify-decisions"
      />
    </Card>
  );
}
