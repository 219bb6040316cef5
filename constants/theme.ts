/**
 * Basted's own look: unbleached-calico paper, ink text, a deep thread-green for actions and a
 * brick red kept for warnings. One family (Inter, shipped in the bundle) in four weights.
 */
export const colors = {
  paper: '#FAF6EF',
  surface: '#FFFFFF',
  surfaceSunken: '#F1EBE0',
  ink: '#1F1D1A',
  inkMuted: '#5E5850',
  line: '#E2D9CB',
  thread: '#2E5E58',
  threadDark: '#21453F',
  threadSoft: '#DCE9E5',
  chalk: '#FFFFFF',
  // Dark enough for 13 px text on every background here, warningSoft included (WCAG AA, 4.5:1).
  warning: '#A3412B',
  warningSoft: '#F6E1DA',
  focus: '#E0A526',
} as const;

export const fonts = {
  regular: 'Inter_400Regular',
  medium: 'Inter_500Medium',
  semibold: 'Inter_600SemiBold',
  bold: 'Inter_700Bold',
} as const;

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;
export const radius = { sm: 6, md: 10, lg: 16 } as const;
export const type = {
  title: { fontFamily: fonts.bold, fontSize: 26, lineHeight: 32, color: colors.ink },
  heading: { fontFamily: fonts.semibold, fontSize: 18, lineHeight: 24, color: colors.ink },
  body: { fontFamily: fonts.regular, fontSize: 16, lineHeight: 24, color: colors.ink },
  label: { fontFamily: fonts.medium, fontSize: 14, lineHeight: 20, color: colors.ink },
  caption: { fontFamily: fonts.regular, fontSize: 13, lineHeight: 18, color: colors.inkMuted },
} as const;

/** Windows at least this wide get the side navigation and multi-column layouts. */
export const WIDE_BREAKPOINT = 900;
/** The readable column a screen's content is centred in. */
export const CONTENT_MAX_WIDTH = 1040;
