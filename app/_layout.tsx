import { useFonts } from 'expo-font';
import { Slot, SplashScreen } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { useEffect } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { SWRConfig } from 'swr';
import { APP_FONTS, WAIT_FOR_FONTS } from '@/constants/fonts';
import { fetcher } from '@/hooks/api';

// On a phone, hold the first paint until the bundled fonts are in; on the web text shows at once
// in a system face and swaps to Inter when it arrives (constants/fonts.web.ts).
if (WAIT_FOR_FONTS) SplashScreen.preventAutoHideAsync().catch(() => {});

export default function RootLayout() {
  // Every face ships with the app; nothing is fetched from a font service.
  const [loaded, error] = useFonts(APP_FONTS);

  useEffect(() => {
    if (loaded || error) SplashScreen.hideAsync().catch(() => {});
  }, [loaded, error]);

  // A font that fails to load falls back to the system face rather than blocking the app.
  if (WAIT_FOR_FONTS && !loaded && !error) return null;

  return (
    <SWRConfig value={{ fetcher, shouldRetryOnError: false }}>
      <SafeAreaProvider>
        <StatusBar style="dark" />
        <Slot />
      </SafeAreaProvider>
    </SWRConfig>
  );
}
