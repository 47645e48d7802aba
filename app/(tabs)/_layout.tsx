// The signed-in shell: tabs chosen by role, as bottom tabs on phones and a side rail when wide.
import { Tabs } from 'expo-router/tabs';
import { AppTabBar } from '@/components/navigation/app-tab-bar';
import { TABS } from '@/components/navigation/role-tabs';
import { SessionGate } from '@/components/screens/shell/session-gate';
import { useLayoutSize } from '@/components/theme/use-layout';

export default function TabsLayout() {
  const size = useLayoutSize();
  return (
    <SessionGate>
      {(me) => (
        <Tabs tabBar={(props) => <AppTabBar {...props} me={me} />} screenOptions={{ headerShown: false, tabBarPosition: size === 'wide' ? 'left' : 'bottom' }}>
          {TABS.map((tab) => (
            <Tabs.Screen key={tab.id} name={tab.id} options={{ title: `${tab.title} · Trimwire` }} />
          ))}
          <Tabs.Screen name="designs" options={{ title: 'Design · Trimwire' }} />
          <Tabs.Screen name="proposals/[id]" options={{ title: 'Proposal · Trimwire' }} />
        </Tabs>
      )}
    </SessionGate>
  );
}
