import type { ViewStyle } from 'react-native';

/**
 * In a browser a finger dragging over the micrograph would scroll or zoom the page instead of
 * drawing a box; `touch-action: none` hands the gesture to the page's own handlers. React Native's
 * typings do not know this web-only style, which react-native-web passes through to CSS.
 */
const webOnly: Record<string, string> = { touchAction: 'none', userSelect: 'none', cursor: 'crosshair' };
export const drawingSurfaceStyle = webOnly as ViewStyle;
