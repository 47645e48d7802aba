// A tab whose work arrives with a later part of the product: says plainly what will appear here
// and what the person will be able to do, without showing invented data.
import { View } from 'react-native';
import { useMe } from '@/components/data/use-me';
import { useTheme } from '@/components/theme/use-theme';
import { Card, EmptyState, ErrorState, Loading, Screen, Text, type IconName } from '@/components/ui';

export type ComingFeatureProps = {
  testID: string;
  title: string;
  icon: IconName;
  emptyTitle: string;
  emptyBody: string;
  steps: readonly string[];
  caution?: string;
};

export function ComingFeatureScreen({ testID, title, icon, emptyTitle, emptyBody, steps, caution }: ComingFeatureProps) {
  const { me, status, error, retry } = useMe();
  const { spacing } = useTheme();
  if (status === 'error') return <Screen testID={testID} title={title}><ErrorState error={error} onRetry={retry} /></Screen>;
  if (!me) return <Screen testID={testID} title={title}><Loading /></Screen>;
  return (
    <Screen testID={testID} title={title} subtitle={me.team.name}>
      <EmptyState icon={icon} title={emptyTitle} body={emptyBody} testID={`${testID}-empty`} />
      <Card title="What you will do here">
        <View style={{ gap: spacing.sm }}>
          {steps.map((step, i) => (
            <View key={step} style={{ flexDirection: 'row', gap: spacing.md }}>
              <Text variant="mono" tone="accent">
                {String(i + 1).padStart(2, '0')}
              </Text>
              <Text style={{ flex: 1 }}>{step}</Text>
            </View>
          ))}
        </View>
      </Card>
      {caution ? (
        <Text variant="caption" tone="muted">
          {caution}
        </Text>
      ) : null}
    </Screen>
  );
}
