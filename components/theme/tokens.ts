import type { TextStyle } from 'react-native';

/** Family names as registered with expo-font in app/_layout.tsx; each weight is its own face. */
export const fontFaces = {
  sansRegular: 'IBMPlexSans_400Regular',
  sansMedium: 'IBMPlexSans_500Medium',
  sansSemiBold: 'IBMPlexSans_600SemiBold',
  monoMedium: 'IBMPlexMono_500Medium',
} as const;

export type TextVariant = 'display' | 'title' | 'heading' | 'body' | 'label' | 'caption' | 'code';

/**
 * Sizes lean large: the app is read at arm's length on a bench, often through safety glasses.
 * Body text at 16 px is the browsers' default size (common practice, no source).
 */
export const typeScale: Record<TextVariant, TextStyle> = {
  display: { fontFamily: fontFaces.sansSemiBold, fontSize: 32, lineHeight: 40, letterSpacing: -0.4 },
  title: { fontFamily: fontFaces.sansSemiBold, fontSize: 26, lineHeight: 34, letterSpacing: -0.2 },
  heading: { fontFamily: fontFaces.sansSemiBold, fontSize: 19, lineHeight: 26 },
  body: { fontFamily: fontFaces.sansRegular, fontSize: 16, lineHeight: 24 },
  label: { fontFamily: fontFaces.sansMedium, fontSize: 16, lineHeight: 22 },
  caption: { fontFamily: fontFaces.sansRegular, fontSize: 14, lineHeight: 20 },
  code: { fontFamily: fontFaces.monoMedium, fontSize: 14, lineHeight: 20 },
};

export const space = {
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
  sm: 6,
  md: 10,
  lg: 16,
  pill: 999,
} as const;

export const sizes = {
  /**
   * Minimum height of anything pressable: gloved fingers are wide. Material Design's minimum
   * touch target is 48 dp; WCAG 2.2 (2.5.5, AAA) asks for 44 CSS px.
   */
  touchTarget: 48,
  /** Text inputs are a little taller than buttons so the caret is easy to place. */
  inputHeight: 52,
  hairline: 1,
  outline: 1.5,
  focusRing: 3,
  iconSmall: 18,
  icon: 22,
  iconLarge: 28,
  brandMark: 36,
  brandMarkLarge: 48,
  /** Compact rail on medium screens, labelled column on wide ones. */
  navRailWidth: 96,
  navColumnWidth: 256,
  /** Signed-out screens: one short form. */
  narrowWidth: 460,
  /** Comfortable reading width for forms and text. */
  readingWidth: 640,
  /** Content cap for list + detail layouts. */
  wideWidth: 1120,
  listPaneWidth: 420,
} as const;

/**
 * Window widths at which the layout changes: common tablet portrait and landscape widths
 * (common practice, no source).
 */
export const breakpoints = {
  medium: 768,
  wide: 1024,
} as const;
