// A slider: a pressable track (press or drag to a point), arrow keys step, Home/End jump to the
// ends; screen readers see it as "adjustable" and can increment or decrement it.
import { useRef, useState } from 'react';
import { View, type GestureResponderEvent, type LayoutChangeEvent } from 'react-native';
import { useTheme } from '@/components/theme/use-theme';
import { Text } from './text';

export type SliderProps = {
  label: string;
  value: number;
  min: number;
  max: number;
  step: number;
  onChange: (value: number) => void;
  /** How the value is written beside the label and read out. */
  format: (value: number) => string;
  testID: string;
};

export function snapToStep(v: number, min: number, max: number, step: number): number {
  const clamped = Math.max(min, Math.min(max, v));
  const snapped = min + Math.round((clamped - min) / step) * step;
  // Round off float noise from the step arithmetic.
  return Math.max(min, Math.min(max, Number(snapped.toPrecision(12))));
}

export function Slider({ label, value, min, max, step, onChange, format, testID }: SliderProps) {
  const { colours, spacing, radii, sizes } = useTheme();
  const width = useRef(0);
  const [focused, setFocused] = useState(false);
  const fraction = max > min ? (Math.max(min, Math.min(max, value)) - min) / (max - min) : 0;
  const set = (v: number) => {
    const next = snapToStep(v, min, max, step);
    if (next !== value) onChange(next);
  };
  const fromEvent = (e: GestureResponderEvent) => {
    if (width.current > 0) set(min + (e.nativeEvent.locationX / width.current) * (max - min));
  };
  // A tenth of the range for PageUp/PageDown, at least one step.
  const page = Math.max(step, Math.round((max - min) / 10 / step) * step);
  const onKeyDown = (e: { nativeEvent: { key: string }; preventDefault?: () => void }) => {
    const key = e.nativeEvent.key;
    const moves: Record<string, number> = { ArrowRight: step, ArrowUp: step, ArrowLeft: -step, ArrowDown: -step, PageUp: page, PageDown: -page };
    if (key in moves) set(value + moves[key]!);
    else if (key === 'Home') set(min);
    else if (key === 'End') set(max);
    else return;
    e.preventDefault?.();
  };
  return (
    <View style={{ gap: spacing.xs }}>
      <View style={{ flexDirection: 'row', justifyContent: 'space-between', gap: spacing.sm }}>
        <Text variant="label">{label}</Text>
        <Text variant="mono" testID={`${testID}-value`}>
          {format(value)}
        </Text>
      </View>
      <View
        testID={testID}
        accessible
        focusable
        accessibilityRole="adjustable"
        accessibilityLabel={label}
        accessibilityValue={{ min, max, now: value, text: format(value) }}
        aria-valuemin={min}
        aria-valuemax={max}
        aria-valuenow={value}
        aria-valuetext={format(value)}
        accessibilityActions={[{ name: 'increment' }, { name: 'decrement' }]}
        onAccessibilityAction={(e) => set(value + (e.nativeEvent.actionName === 'increment' ? step : -step))}
        onLayout={(e: LayoutChangeEvent) => {
          width.current = e.nativeEvent.layout.width;
        }}
        onStartShouldSetResponder={() => true}
        onMoveShouldSetResponder={() => true}
        onResponderGrant={fromEvent}
        onResponderMove={fromEvent}
        {...({ onKeyDown, onFocus: () => setFocused(true), onBlur: () => setFocused(false), tabIndex: 0 } as object)}
        style={{
          height: sizes.controlCompact,
          justifyContent: 'center',
          borderRadius: radii.sm,
          outlineWidth: focused ? 2 : 0,
          outlineColor: colours.focus,
          outlineStyle: 'solid',
        }}
      >
        <View pointerEvents="none" style={{ height: spacing.xs, borderRadius: radii.pill, backgroundColor: colours.surfaceSunken }}>
          <View style={{ width: `${fraction * 100}%`, height: '100%', borderRadius: radii.pill, backgroundColor: colours.accent }} />
        </View>
        <View
          pointerEvents="none"
          style={{
            position: 'absolute',
            left: `${fraction * 100}%`,
            marginLeft: -spacing.sm,
            width: spacing.lg,
            height: spacing.lg,
            borderRadius: radii.pill,
            backgroundColor: colours.switchThumb,
            borderWidth: 2,
            borderColor: colours.accent,
          }}
        />
      </View>
    </View>
  );
}
