// Root layout: loads the shipped fonts (keeping the splash up until they are ready), sets the
// providers and re-exports the router's error boundary.
import { useEffect } from 'react';
import { Stack } from 'expo-router';
import { useFonts } from 'expo-font';
import * as SplashScreen from 'expo-splash-screen';
import { StatusBar } from 'expo-status-bar';
import { Providers } from '@/components/screens/shell/providers';

export { ErrorBoundary } from 'expo-router';

void SplashScreen.preventAutoHideAsync();

export default function RootLayout() {
  const [loaded, error] = useFonts({
    IBMPlexSans_400Regular: require('../assets/fonts/IBMPlexSans_400Regular.ttf'),
    IBMPlexSans_500Medium: require('../assets/fonts/IBMPlexSans_500Medium.ttf'),
    IBMPlexSans_600SemiBold: require('../assets/fonts/IBMPlexSans_600SemiBold.ttf'),
    IBMPlexMono_400Regular: require('../assets/fonts/IBMPlexMono_400Regular.ttf'),
    IBMPlexMono_500Medium: require('../assets/fonts/IBMPlexMono_500Medium.ttf'),
  });

  useEffect(() => {
    // A font that fails to load falls back to the system face; never leave the splash up.
    if (loaded || error) void SplashScreen.hideAsync();
  }, [loaded, error]);

  if (!loaded && !error) return null;

  return (
    <Providers>
      <StatusBar style="auto" />
      <Stack screenOptions={{ headerShown: false }} />
    </Providers>
  );
}
