// /bench — only for roles whose tab list includes it.
import { BenchScreen } from '@/components/screens/bench/bench-screen';
import { TabGuard } from '@/components/screens/shell/tab-guard';

export default function BenchRoute() {
  return (
    <TabGuard tab="bench">
      <BenchScreen />
    </TabGuard>
  );
}
