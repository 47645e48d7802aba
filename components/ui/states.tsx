// The three non-data states every screen shows before its data: error, loading and empty.
import { ActivityIndicator, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { errorSentence } from '@/components/data/error-sentences';
import { Button } from './button';
import { Icon, type IconName } from './icon';
import { Text } from './text';

export function ErrorState({ error, onRetry, testID = 'error-state' }: { error: unknown; onRetry?: () => void; testID?: string }) {
  const { colours, spacing, radii, sizes } = useTheme();
  return (
    <View
      testID={testID}
      accessibilityRole="alert"
      style={{ backgroundColor: colours.dangerSoft, borderRadius: radii.lg, padding: spacing.lg, gap: spacing.md, borderWidth: sizes.hairline, borderColor: colours.danger }}
    >
      <View style={{ flexDirection: 'row', gap: spacing.sm, alignItems: 'center' }}>
        <Icon name="alert" colour={colours.danger} size={sizes.iconSmall} />
        <Text variant="bodyStrong" tone="danger" style={{ flexShrink: 1 }}>
          {errorSentence(error)}
        </Text>
      </View>
      {onRetry ? (
        <View style={{ alignSelf: 'flex-start' }}>
          <Button label="Try again" variant="secondary" compact onPress={onRetry} testID={`${testID}-retry`} />
        </View>
      ) : null}
    </View>
  );
}

export function Loading({ label = 'Loading…', testID = 'loading' }: { label?: string; testID?: string }) {
  const { colours, spacing } = useTheme();
  return (
    <View testID={testID} accessibilityRole="progressbar" accessibilityLabel={label} style={{ padding: spacing.xl, alignItems: 'center', gap: spacing.sm }}>
      <ActivityIndicator color={colours.accent} />
      <Text tone="muted">{label}</Text>
    </View>
  );
}

export function EmptyState({ icon, title, body, testID = 'empty-state', children }: { icon: IconName; title: string; body: string; testID?: string; children?: React.ReactNode }) {
  const { colours, spacing, radii, sizes } = useTheme();
  return (
    <View
      testID={testID}
      style={{
        alignItems: 'center',
        paddingVertical: spacing.xxxl,
        paddingHorizontal: spacing.xl,
        gap: spacing.md,
        borderRadius: radii.lg,
        borderWidth: sizes.hairline,
        borderColor: colours.border,
        borderStyle: 'dashed',
        backgroundColor: colours.surface,
      }}
    >
      <View style={{ backgroundColor: colours.accentSoft, borderRadius: radii.pill, padding: spacing.md }}>
        <Icon name={icon} colour={colours.accent} size={sizes.icon} />
      </View>
      <Text variant="title" style={{ textAlign: 'center' }}>
        {title}
      </Text>
      <Text tone="muted" style={{ textAlign: 'center', maxWidth: sizes.form + spacing.xxxl }}>
        {body}
      </Text>
      {children}
    </View>
  );
}
