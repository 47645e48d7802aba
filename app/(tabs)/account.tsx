// /account — only for roles whose tab list includes it.
import { AccountScreen } from '@/components/screens/account/account-screen';
import { TabGuard } from '@/components/screens/shell/tab-guard';

export default function AccountRoute() {
  return (
    <TabGuard tab="account">
      <AccountScreen />
    </TabGuard>
  );
}
