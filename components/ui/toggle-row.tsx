// A labelled on/off switch with an explanation line.
import { Switch, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export function ToggleRow({ label, description, value, onChange, testID, disabled }: { label: string; description: string; value: boolean; onChange: (value: boolean) => void; testID: string; disabled?: boolean }) {
  const { colours, spacing } = useTheme();
  return (
    <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.md }}>
      <View style={{ flex: 1, gap: spacing.xxs }}>
        <Text variant="bodyStrong">{label}</Text>
        <Text variant="caption" tone="muted">
          {description}
        </Text>
      </View>
      <Switch
        testID={testID}
        accessibilityLabel={label}
        value={value}
        disabled={disabled}
        onValueChange={onChange}
        trackColor={{ false: colours.borderStrong, true: colours.accent }}
        thumbColor={colours.switchThumb}
        {...({ activeThumbColor: colours.switchThumb } as object)}
      />
    </View>
  );
}
