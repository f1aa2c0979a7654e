export { darkPalette, lightPalette, type Palette } from './colors';
export { breakpoints, fontFaces, radii, sizes, space, typeScale, type TextVariant } from './tokens';
export { useTheme, type Theme } from './use-theme';
