// /designs/… — a design's pages, stacked inside the bench's shell so the tabs stay in view.
import { Stack } from 'expo-router';
import { TabGuard } from '@/components/screens/shell/tab-guard';

export default function DesignsLayout() {
  return (
    <TabGuard tab="bench">
      <Stack screenOptions={{ headerShown: false }} />
    </TabGuard>
  );
}
