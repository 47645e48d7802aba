// /handout/:id — the printable page of a lesson, for signed-in readers of it (no tabs: it is for paper).
import { HandoutScreen } from '@/components/screens/lessons/handout-screen';
import { SessionGate } from '@/components/screens/shell/session-gate';

export default function HandoutRoute() {
  return <SessionGate>{() => <HandoutScreen />}</SessionGate>;
}
