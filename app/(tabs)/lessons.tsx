// /lessons — only for roles whose tab list includes it.
import { LessonsScreen } from '@/components/screens/lessons/lessons-screen';
import { TabGuard } from '@/components/screens/shell/tab-guard';

export default function LessonsRoute() {
  return (
    <TabGuard tab="lessons">
      <LessonsScreen />
    </TabGuard>
  );
}
