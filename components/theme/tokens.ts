// Design tokens: the only place colours, sizes, radii and font names are written down.
// Everything else reads them through useTheme() so light and dark stay consistent.

export const spacing = {
  none: 0,
  xxs: 2,
  xs: 4,
  sm: 8,
  md: 12,
  lg: 16,
  xl: 24,
  xxl: 32,
  xxxl: 48,
} as const;

export const radii = {
  sm: 4,
  md: 8,
  lg: 12,
  pill: 999,
} as const;

// Font family names are the keys handed to expo-font's useFonts in app/_layout.tsx.
export const fontFamilies = {
  regular: 'IBMPlexSans_400Regular',
  medium: 'IBMPlexSans_500Medium',
  semibold: 'IBMPlexSans_600SemiBold',
  mono: 'IBMPlexMono_400Regular',
  monoMedium: 'IBMPlexMono_500Medium',
} as const;

export const typeScale = {
  caption: { fontSize: 12, lineHeight: 16, fontFamily: fontFamilies.regular },
  label: { fontSize: 13, lineHeight: 18, fontFamily: fontFamilies.medium },
  body: { fontSize: 15, lineHeight: 22, fontFamily: fontFamilies.regular },
  bodyStrong: { fontSize: 15, lineHeight: 22, fontFamily: fontFamilies.medium },
  title: { fontSize: 18, lineHeight: 26, fontFamily: fontFamilies.semibold },
  headline: { fontSize: 24, lineHeight: 32, fontFamily: fontFamilies.semibold },
  mono: { fontSize: 13, lineHeight: 20, fontFamily: fontFamilies.mono },
  overline: { fontSize: 11, lineHeight: 16, fontFamily: fontFamilies.medium, letterSpacing: 0.8 },
} as const;

export type TypeVariant = keyof typeof typeScale;

export const palettes = {
  light: {
    background: '#F5F6F8',
    surface: '#FFFFFF',
    surfaceMuted: '#EEF1F4',
    surfaceSunken: '#E6EAEF',
    border: '#D8DDE3',
    borderStrong: '#B9C1CA',
    text: '#17202A',
    textMuted: '#5B6672',
    textFaint: '#8691A0',
    accent: '#1D5C8A',
    accentPressed: '#174A70',
    accentSoft: '#E2EDF6',
    onAccent: '#FFFFFF',
    danger: '#B3261E',
    dangerSoft: '#FCEBEA',
    warning: '#8A5A00',
    warningSoft: '#FFF3D6',
    success: '#17703A',
    successSoft: '#E4F3E9',
    overlay: 'rgba(23, 32, 42, 0.04)',
    focus: '#2E7DBA',
    transparent: 'transparent',
    switchThumb: '#FFFFFF',
  },
  dark: {
    background: '#0F1318',
    surface: '#171C23',
    surfaceMuted: '#1E252E',
    surfaceSunken: '#12171D',
    border: '#2B333D',
    borderStrong: '#3C4652',
    text: '#E5E9EE',
    textMuted: '#9BA6B3',
    textFaint: '#6E7987',
    accent: '#6DB1E3',
    accentPressed: '#8CC3EA',
    accentSoft: '#1B2E3D',
    onAccent: '#0B1620',
    danger: '#F08A82',
    dangerSoft: '#3A1C1A',
    warning: '#E8B04B',
    warningSoft: '#33280F',
    success: '#6CC58E',
    successSoft: '#15301F',
    overlay: 'rgba(229, 233, 238, 0.05)',
    focus: '#8CC3EA',
    transparent: 'transparent',
    switchThumb: '#E5E9EE',
  },
} as const;

export type ColourScheme = keyof typeof palettes;
export type Palette = { readonly [K in keyof (typeof palettes)['light']]: string };

export const sizes = {
  hairline: 1,
  iconSmall: 16,
  icon: 22,
  iconLarge: 40,
  control: 44,
  controlCompact: 34,
  iconStroke: 1.75,
  tabBar: 60,
  rail: 236,
  listPane: 380,
  content: 760,
  page: 1120,
  form: 400,
  brandMark: 28,
} as const;

export const opacity = {
  disabled: 0.55,
  // The part of a bar a later value no longer uses (a board's parts saved by accepted proposals).
  faded: 0.3,
} as const;

// At or above this width the shell shows a side rail and two-pane screens instead of bottom tabs.
export const breakpoints = {
  wide: 900,
} as const;
