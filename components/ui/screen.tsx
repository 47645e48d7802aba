// The frame of every screen: safe area, background, a title block and a scrolling body whose
// width is capped so lines stay readable on wide windows.
import type { ReactNode } from 'react';
import { ScrollView, View } from 'react-native';
import { SafeAreaView } from 'react-native-safe-area-context';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type ScreenProps = {
  title?: string;
  subtitle?: string;
  testID: string;
  children: ReactNode;
  // 'content' caps the width for reading; 'full' gives two-pane screens a wider page.
  width?: 'content' | 'full';
  scroll?: boolean;
  headerAccessory?: ReactNode;
};

export function Screen({ title, subtitle, testID, children, width = 'content', scroll = true, headerAccessory }: ScreenProps) {
  const { colours, spacing, sizes } = useTheme();
  const inner = (
    <View style={{ width: '100%', maxWidth: width === 'content' ? sizes.content : sizes.page, alignSelf: 'center', gap: spacing.lg, flexGrow: 1 }}>
      {title ? (
        <View style={{ flexDirection: 'row', alignItems: 'flex-end', justifyContent: 'space-between', gap: spacing.md }}>
          <View style={{ flexShrink: 1, gap: spacing.xxs }}>
            <Text variant="headline" accessibilityRole="header">
              {title}
            </Text>
            {subtitle ? <Text tone="muted">{subtitle}</Text> : null}
          </View>
          {headerAccessory}
        </View>
      ) : null}
      {children}
    </View>
  );
  return (
    <SafeAreaView testID={testID} edges={['top', 'left', 'right']} style={{ flex: 1, backgroundColor: colours.background }}>
      {scroll ? (
        <ScrollView contentContainerStyle={{ padding: spacing.lg, paddingBottom: spacing.xxxl, flexGrow: 1 }} keyboardShouldPersistTaps="handled">
          {inner}
        </ScrollView>
      ) : (
        <View style={{ flex: 1, padding: spacing.lg }}>{inner}</View>
      )}
    </SafeAreaView>
  );
}
