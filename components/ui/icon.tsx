// Line icons drawn with react-native-svg (system glyph fonts lack the default tab icons).
// Each icon is a list of SVG path strings on a 24-unit grid, stroked in the caller's colour.
import Svg, { Path } from 'react-native-svg';
import { useTheme } from '@/components/theme/use-theme';

const PATHS = {
  // A chip on a board: the design bench.
  bench: ['M7 7h10v10H7z', 'M10 4v3', 'M14 4v3', 'M10 17v3', 'M14 17v3', 'M4 10h3', 'M4 14h3', 'M17 10h3', 'M17 14h3'],
  // A document with a tick: sign-off.
  signOff: ['M6 3h9l3 3v15H6z', 'M15 3v3h3', 'M9 13.5l2 2 4-4.5'],
  // An open book: lessons.
  lessons: ['M3 5.5c3-1 6-1 9 1v13c-3-2-6-2-9-1z', 'M21 5.5c-3-1-6-1-9 1v13c3-2 6-2 9-1z'],
  team: ['M9 11a3 3 0 1 0 0-6 3 3 0 0 0 0 6z', 'M3.5 19c.6-3 2.8-5 5.5-5s4.9 2 5.5 5', 'M16 5.5a2.6 2.6 0 0 1 0 5.2', 'M17.5 14c1.6.6 2.7 2.4 3 5'],
  account: ['M12 12a4 4 0 1 0 0-8 4 4 0 0 0 0 8z', 'M4.5 20.5c.8-3.6 3.8-6 7.5-6s6.7 2.4 7.5 6'],
  mail: ['M3.5 6h17v12h-17z', 'M3.5 6.5l8.5 6.5 8.5-6.5'],
  log: ['M8 6h12', 'M8 12h12', 'M8 18h12', 'M4 6h.01', 'M4 12h.01', 'M4 18h.01'],
  members: ['M12 11a3.5 3.5 0 1 0 0-7 3.5 3.5 0 0 0 0 7z', 'M5 20c.7-3.5 3.5-6 7-6s6.3 2.5 7 6'],
  back: ['M15 5l-7 7 7 7'],
  forward: ['M9 5l7 7-7 7'],
  alert: ['M12 4l9 16H3z', 'M12 10v4', 'M12 17h.01'],
  check: ['M5 12.5l4.5 4.5L19 7.5'],
  signOut: ['M14 4h5v16h-5', 'M10 8l-4 4 4 4', 'M6 12h10'],
  swap: ['M5 8h13l-3-3', 'M19 16H6l3 3'],
  plus: ['M12 5v14', 'M5 12h14'],
  upload: ['M12 15V4', 'M7.5 8.5L12 4l4.5 4.5', 'M4 15v5h16v-5'],
  download: ['M12 4v11', 'M7.5 10.5L12 15l4.5-4.5', 'M4 15v5h16v-5'],
  // A magnifier over a trace: scan.
  scan: ['M10.5 17a6.5 6.5 0 1 0 0-13 6.5 6.5 0 0 0 0 13z', 'M15.5 15.5L20 20', 'M6.5 10.5h2l1-2 2 4 1-2h1'],
  close: ['M6 6l12 12', 'M18 6L6 18'],
  history: ['M4 12a8 8 0 1 0 2.3-5.6', 'M4 4v4h4', 'M12 8v4l3 2'],
  // Resistor zig-zag between two leads: the product mark.
  mark: ['M2 12h4l1.5-4 3 8 3-8 3 8 1.5-4h4'],
} as const;

export type IconName = keyof typeof PATHS;

export function Icon({ name, colour, size }: { name: IconName; colour?: string; size?: number }) {
  const theme = useTheme();
  const stroke = colour ?? theme.colours.text;
  const px = size ?? theme.sizes.icon;
  return (
    <Svg width={px} height={px} viewBox="0 0 24 24" fill="none" accessibilityElementsHidden importantForAccessibility="no-hide-descendants">
      {PATHS[name].map((d) => (
        <Path key={d} d={d} stroke={stroke} strokeWidth={theme.sizes.iconStroke} strokeLinecap="round" strokeLinejoin="round" fill="none" />
      ))}
    </Svg>
  );
}
