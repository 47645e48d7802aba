// A bordered surface grouping related content, with an optional heading.
import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export function Card({ title, description, children, testID, padded = true }: { title?: string; description?: string; children?: ReactNode; testID?: string; padded?: boolean }) {
  const { colours, spacing, radii, sizes } = useTheme();
  return (
    <View
      testID={testID}
      style={{
        backgroundColor: colours.surface,
        borderRadius: radii.lg,
        borderWidth: sizes.hairline,
        borderColor: colours.border,
        padding: padded ? spacing.lg : spacing.none,
        gap: spacing.md,
        overflow: 'hidden',
      }}
    >
      {title ? (
        <View style={{ gap: spacing.xxs, paddingHorizontal: padded ? spacing.none : spacing.lg, paddingTop: padded ? spacing.none : spacing.lg }}>
          <Text variant="title">{title}</Text>
          {description ? <Text tone="muted">{description}</Text> : null}
        </View>
      ) : null}
      {children}
    </View>
  );
}
