import { useWindowDimensions } from 'react-native';
import { WIDE_BREAKPOINT } from '@/constants/theme';

/** The one breakpoint: true on windows at least WIDE_BREAKPOINT px wide. */
export function useIsWide(): boolean {
  return useWindowDimensions().width >= WIDE_BREAKPOINT;
}
