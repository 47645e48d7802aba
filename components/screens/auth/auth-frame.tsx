// The frame around the signed-out screens: a single centred column on phones; on wide windows
// the product's purpose on the left and the form on the right.
import type { ReactNode } from 'react';
import { ScrollView, View } from 'react-native';
import { SafeAreaView } from 'react-native-safe-area-context';
import { useTheme } from '@/components/theme/use-theme';
import { useLayoutSize } from '@/components/theme/use-layout';
import { Icon, Text } from '@/components/ui';

type FrameProps = { title: string; subtitle: string; children: ReactNode; testID: string };

export function AuthFrame(props: FrameProps) {
  return useLayoutSize() === 'wide' ? <AuthFrameWide {...props} /> : <AuthFramePhone {...props} />;
}

function Brand() {
  const { colours, spacing, sizes, radii } = useTheme();
  return (
    <View style={{ flexDirection: 'row', alignItems: 'center', gap: spacing.sm }}>
      <View style={{ width: sizes.brandMark, height: sizes.brandMark, borderRadius: radii.md, backgroundColor: colours.accent, alignItems: 'center', justifyContent: 'center' }}>
        <Icon name="mark" colour={colours.onAccent} size={sizes.iconSmall} />
      </View>
      <Text variant="title">Trimwire</Text>
    </View>
  );
}

function FormBlock({ title, subtitle, children }: Omit<FrameProps, 'testID'>) {
  const { spacing } = useTheme();
  return (
    <View style={{ gap: spacing.xl }}>
      <View style={{ gap: spacing.xs }}>
        <Text variant="headline" accessibilityRole="header">
          {title}
        </Text>
        <Text tone="muted">{subtitle}</Text>
      </View>
      <View style={{ gap: spacing.lg }}>{children}</View>
    </View>
  );
}

function AuthFramePhone({ testID, ...block }: FrameProps) {
  const { colours, spacing, sizes } = useTheme();
  return (
    <SafeAreaView testID={testID} style={{ flex: 1, backgroundColor: colours.background }}>
      <ScrollView contentContainerStyle={{ flexGrow: 1, padding: spacing.xl, gap: spacing.xxl }} keyboardShouldPersistTaps="handled">
        <Brand />
        <View style={{ width: '100%', maxWidth: sizes.form, alignSelf: 'center' }}>
          <FormBlock {...block} />
        </View>
      </ScrollView>
    </SafeAreaView>
  );
}

const POINTS = [
  { title: 'Find', body: 'Drivers built once per bit slice, override stages and tri-state outputs that can be shared or slimmed.' },
  { title: 'Prove', body: 'Each rewrite checked equivalent under your stated assumptions, or shown with a counterexample.' },
  { title: 'Price', body: 'Parts, board area and cost saved, with first-order electrical margins at worst-case corners.' },
];

function AuthFrameWide({ testID, ...block }: FrameProps) {
  const { colours, spacing, sizes } = useTheme();
  return (
    <SafeAreaView testID={testID} style={{ flex: 1, flexDirection: 'row', backgroundColor: colours.background }}>
      <View style={{ flex: 1, backgroundColor: colours.surfaceSunken, borderRightWidth: sizes.hairline, borderRightColor: colours.border, padding: spacing.xxxl, justifyContent: 'space-between' }}>
        <Brand />
        <View style={{ gap: spacing.xl, maxWidth: sizes.form + spacing.xxxl }}>
          <Text variant="headline">Fit the design to the board.</Text>
          {POINTS.map((point) => (
            <View key={point.title} style={{ gap: spacing.xxs }}>
              <Text variant="overline" tone="accent">
                {point.title}
              </Text>
              <Text tone="muted">{point.body}</Text>
            </View>
          ))}
        </View>
        <Text variant="caption" tone="faint">
          Margins are first-order estimates. Simulate the exported deck and check the parts' data sheets before building.
        </Text>
      </View>
      <ScrollView style={{ flex: 1 }} contentContainerStyle={{ flexGrow: 1, justifyContent: 'center', padding: spacing.xxxl }} keyboardShouldPersistTaps="handled">
        <View style={{ width: '100%', maxWidth: sizes.form, alignSelf: 'center' }}>
          <FormBlock {...block} />
        </View>
      </ScrollView>
    </SafeAreaView>
  );
}
