import { Inter_400Regular } from '@expo-google-fonts/inter/400Regular';
import { Inter_500Medium } from '@expo-google-fonts/inter/500Medium';
import { Inter_600SemiBold } from '@expo-google-fonts/inter/600SemiBold';
import { Inter_700Bold } from '@expo-google-fonts/inter/700Bold';
import Ionicons from '@expo/vector-icons/Ionicons';

/** The faces the app uses, by the family names of constants/theme.ts (TrueType on a phone). */
export const APP_FONTS = { Inter_400Regular, Inter_500Medium, Inter_600SemiBold, Inter_700Bold, ...Ionicons.font };

/** A phone waits for its fonts (they are in the app, so this is short); the web does not (fonts.web.ts). */
export const WAIT_FOR_FONTS = true;
