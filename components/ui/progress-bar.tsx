// A horizontal bar for a share of a whole: scan progress, a board's use of its budget. An optional
// second mark shows a later value (use after the accepted proposals) against the first.
import { View } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';

export type ProgressTone = 'accent' | 'success' | 'warning' | 'danger';

export function ProgressBar({ value, after, tone = 'accent', label, testID }: { value: number; after?: number; tone?: ProgressTone; label: string; testID?: string }) {
  const { colours, radii, spacing, opacity } = useTheme();
  const clamp = (v: number) => Math.max(0, Math.min(1, Number.isFinite(v) ? v : 0));
  const fill = { accent: colours.accent, success: colours.success, warning: colours.warning, danger: colours.danger }[tone];
  const now = clamp(value);
  const later = after === undefined ? undefined : clamp(after);
  return (
    <View
      testID={testID}
      accessibilityRole="progressbar"
      accessibilityLabel={label}
      accessibilityValue={{ min: 0, max: 100, now: Math.round(now * 100) }}
      style={{ height: spacing.sm, borderRadius: radii.pill, backgroundColor: colours.surfaceSunken, overflow: 'hidden' }}
    >
      {later !== undefined && later < now ? (
        <>
          {/* What stays after the accepted proposals, then the part they save, lighter. */}
          <View style={{ position: 'absolute', left: 0, top: 0, bottom: 0, width: `${now * 100}%`, backgroundColor: fill, opacity: opacity.faded }} />
          <View style={{ position: 'absolute', left: 0, top: 0, bottom: 0, width: `${later * 100}%`, backgroundColor: fill }} />
        </>
      ) : (
        <View style={{ position: 'absolute', left: 0, top: 0, bottom: 0, width: `${now * 100}%`, backgroundColor: fill }} />
      )}
    </View>
  );
}
