// A labelled text input with an optional hint and an error line under it.
import { useState } from 'react';
import { TextInput, View, type TextInputProps } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type TextFieldProps = Omit<TextInputProps, 'style'> & {
  label: string;
  testID: string;
  error?: string | null;
  hint?: string;
};

export function TextField({ label, testID, error, hint, accessibilityLabel, ...input }: TextFieldProps) {
  const { colours, spacing, radii, sizes, type } = useTheme();
  const [focused, setFocused] = useState(false);
  return (
    <View style={{ gap: spacing.xs }}>
      <Text variant="label" tone="muted">
        {label}
      </Text>
      <TextInput
        {...input}
        testID={testID}
        accessibilityLabel={accessibilityLabel ?? label}
        placeholderTextColor={colours.textFaint}
        onFocus={(e) => {
          setFocused(true);
          input.onFocus?.(e);
        }}
        onBlur={(e) => {
          setFocused(false);
          input.onBlur?.(e);
        }}
        style={[
          type.body,
          {
            minHeight: sizes.control,
            paddingHorizontal: spacing.md,
            borderRadius: radii.md,
            borderWidth: sizes.hairline,
            borderColor: error ? colours.danger : focused ? colours.focus : colours.borderStrong,
            backgroundColor: colours.surface,
            color: colours.text,
            outlineStyle: 'none',
          } as object,
        ]}
      />
      {error ? (
        <Text variant="caption" tone="danger" testID={`${testID}-error`}>
          {error}
        </Text>
      ) : hint ? (
        <Text variant="caption" tone="faint">
          {hint}
        </Text>
      ) : null}
    </View>
  );
}
