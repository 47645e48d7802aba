// A single choice among a few options, shown as a row of chips (roles, sections).
import { Pressable, View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type Choice<T extends string> = { value: T; label: string };

export function ChoiceChips<T extends string>({ choices, value, onChange, testID, label }: { choices: readonly Choice<T>[]; value: T; onChange: (value: T) => void; testID: string; label: string }) {
  const { colours, spacing, radii, sizes } = useTheme();
  return (
    <View accessibilityRole="radiogroup" accessibilityLabel={label} style={{ flexDirection: 'row', flexWrap: 'wrap', gap: spacing.xs }}>
      {choices.map((choice) => {
        const selected = choice.value === value;
        return (
          <Pressable
            key={choice.value}
            testID={`${testID}-${choice.value}`}
            accessibilityRole="radio"
            accessibilityLabel={`${label}: ${choice.label}`}
            accessibilityState={{ selected, checked: selected }}
            onPress={() => onChange(choice.value)}
            style={({ pressed }) => ({
              paddingHorizontal: spacing.md,
              minHeight: sizes.controlCompact,
              justifyContent: 'center',
              borderRadius: radii.pill,
              borderWidth: sizes.hairline,
              borderColor: selected ? colours.accent : colours.border,
              backgroundColor: selected ? colours.accentSoft : pressed ? colours.surfaceMuted : colours.surface,
            })}
          >
            <Text variant="label" tone={selected ? 'accent' : 'muted'}>
              {choice.label}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}
