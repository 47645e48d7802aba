// /sign-off — only for roles whose tab list includes it.
import { SignOffScreen } from '@/components/screens/sign-off/sign-off-screen';
import { TabGuard } from '@/components/screens/shell/tab-guard';

export default function SignOffRoute() {
  return (
    <TabGuard tab="sign-off">
      <SignOffScreen />
    </TabGuard>
  );
}
