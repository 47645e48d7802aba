// List + detail: side by side on wide windows; on phones the detail replaces the list while
// something is selected, with a way back.
import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { useLayoutSize } from '@/components/theme/use-layout';
import { Button } from '@/components/ui/button';

export type TwoPaneProps = {
  list: ReactNode;
  detail: ReactNode | null;
  // What the wide detail pane shows while nothing is selected.
  placeholder: ReactNode;
  // Shown above the list on phones and above the detail on wide windows (e.g. a create form).
  aside?: ReactNode;
  onBack: () => void;
  backLabel: string;
  testID: string;
};

export function TwoPane(props: TwoPaneProps) {
  return useLayoutSize() === 'wide' ? <TwoPaneWide {...props} /> : <TwoPanePhone {...props} />;
}

function TwoPaneWide({ list, detail, placeholder, aside, testID }: TwoPaneProps) {
  const { spacing, sizes } = useTheme();
  return (
    <View testID={testID} style={{ flexDirection: 'row', gap: spacing.lg, alignItems: 'flex-start' }}>
      <View style={{ width: sizes.listPane }}>{list}</View>
      <View testID={`${testID}-detail`} style={{ flex: 1, minWidth: 0, gap: spacing.lg }}>
        {aside}
        {detail ?? placeholder}
      </View>
    </View>
  );
}

function TwoPanePhone({ list, detail, aside, onBack, backLabel, testID }: TwoPaneProps) {
  const { spacing } = useTheme();
  if (detail === null) {
    return (
      <View testID={testID} style={{ gap: spacing.lg }}>
        {aside}
        {list}
      </View>
    );
  }
  return (
    <View testID={`${testID}-detail`} style={{ gap: spacing.md }}>
      <View style={{ alignSelf: 'flex-start' }}>
        <Button label={backLabel} icon="back" variant="ghost" compact onPress={onBack} testID={`${testID}-back`} />
      </View>
      {detail}
    </View>
  );
}
