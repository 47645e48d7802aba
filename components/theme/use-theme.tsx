// Theme context: picks the light or dark palette from the system scheme and hands out every token.
import { createContext, useContext, useMemo, type ReactNode } from 'react';
import { useColorScheme } from 'react-native';
import { breakpoints, fontFamilies, opacity, palettes, radii, sizes, spacing, typeScale, type ColourScheme, type Palette } from './tokens';

export type Theme = {
  scheme: ColourScheme;
  colours: Palette;
  spacing: typeof spacing;
  radii: typeof radii;
  type: typeof typeScale;
  fonts: typeof fontFamilies;
  sizes: typeof sizes;
  breakpoints: typeof breakpoints;
  opacity: typeof opacity;
};

export function makeTheme(scheme: ColourScheme): Theme {
  return { scheme, colours: palettes[scheme], spacing, radii, type: typeScale, fonts: fontFamilies, sizes, breakpoints, opacity };
}

const ThemeContext = createContext<Theme>(makeTheme('light'));

export function ThemeProvider({ children, scheme }: { children: ReactNode; scheme?: ColourScheme }) {
  const system = useColorScheme();
  const chosen: ColourScheme = scheme ?? (system === 'dark' ? 'dark' : 'light');
  const theme = useMemo(() => makeTheme(chosen), [chosen]);
  return <ThemeContext.Provider value={theme}>{children}</ThemeContext.Provider>;
}

export function useTheme(): Theme {
  return useContext(ThemeContext);
}
