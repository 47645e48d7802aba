// Everything the app needs around its routes: safe areas, theme and data (with the session).
import type { ReactNode } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { DataProvider } from '@/components/data/swr-config';
import { ThemeProvider } from '@/components/theme/use-theme';

export function Providers({ children }: { children: ReactNode }) {
  return (
    <SafeAreaProvider>
      <ThemeProvider>
        <DataProvider>{children}</DataProvider>
      </ThemeProvider>
    </SafeAreaProvider>
  );
}
