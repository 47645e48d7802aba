// The teams the person belongs to, their role in each, and switching the current one.
import { useState } from 'react';
import { useRouter } from 'expo-router';
import { errorSentence } from '@/components/data/error-sentences';
import { useSessionActions } from '@/components/data/use-me';
import type { Me } from '@/components/data/types';
import { homeTabFor } from '@/components/navigation/role-tabs';
import { roleLabel } from '@/components/navigation/role-labels';
import { Badge, Button, Card, ListRow, Notice } from '@/components/ui';

export function TeamsCard({ me }: { me: Me }) {
  const router = useRouter();
  const { switchTeam } = useSessionActions();
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function switchTo(teamId: string) {
    setBusy(teamId);
    setError(null);
    try {
      const next = await switchTeam(teamId);
      router.replace(`/${homeTabFor(next.role)}`);
    } catch (e) {
      setError(errorSentence(e));
      setBusy(null);
    }
  }

  return (
    <Card title="Teams" description={me.teams.length > 1 ? 'Switch to work in another team; your tabs follow your role there.' : undefined} padded={false}>
      {error ? <Notice tone="warning" message={error} testID="teams-error" /> : null}
      {me.teams.map((team, i) => (
        <ListRow
          key={team.id}
          testID={`team-${team.id}`}
          title={team.name}
          subtitle={roleLabel(team.role)}
          last={i === me.teams.length - 1}
          trailing={
            team.id === me.team.id ? (
              <Badge label="Current" tone="accent" />
            ) : (
              <Button label="Switch" variant="secondary" compact busy={busy === team.id} onPress={() => switchTo(team.id)} testID={`switch-team-${team.id}`} accessibilityLabel={`Switch to ${team.name}`} />
            )
          }
        />
      ))}
    </Card>
  );
}
