import Ionicons from '@expo/vector-icons/Ionicons';
import { FontDisplay } from 'expo-font';

// On the web: the Latin WOFF2 files (about 24 KB each against 300 KB and more for each TrueType
// face), shown with font-display: swap, so the first text appears in a system face at once and
// takes Inter when it arrives.
const face = (uri: number) => ({ uri, display: FontDisplay.SWAP });

/* eslint-disable @typescript-eslint/no-require-imports -- Metro turns each require into the font asset. */
export const APP_FONTS = {
  Inter_400Regular: face(require('@fontsource/inter/files/inter-latin-400-normal.woff2')),
  Inter_500Medium: face(require('@fontsource/inter/files/inter-latin-500-normal.woff2')),
  Inter_600SemiBold: face(require('@fontsource/inter/files/inter-latin-600-normal.woff2')),
  Inter_700Bold: face(require('@fontsource/inter/files/inter-latin-700-normal.woff2')),
  ...Ionicons.font,
};
/* eslint-enable @typescript-eslint/no-require-imports */

export const WAIT_FOR_FONTS = false;
