// Tells screens whether they are on a phone-sized or a wide window, from the tokens' breakpoint.
import { useWindowDimensions } from 'react-native';
import { breakpoints } from './tokens';

export type LayoutSize = 'phone' | 'wide';

export function layoutSizeFor(width: number): LayoutSize {
  return width >= breakpoints.wide ? 'wide' : 'phone';
}

export function useLayoutSize(): LayoutSize {
  const { width } = useWindowDimensions();
  return layoutSizeFor(width);
}
