// /team — only for roles whose tab list includes it.
import { TeamScreen } from '@/components/screens/team/team-screen';
import { TabGuard } from '@/components/screens/shell/tab-guard';

export default function TeamRoute() {
  return (
    <TabGuard tab="team">
      <TeamScreen />
    </TabGuard>
  );
}
