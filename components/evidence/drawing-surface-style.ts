import type { ViewStyle } from 'react-native';

/** On phones and tablets the responder system already keeps a drag on the view that took it. */
export const drawingSurfaceStyle: ViewStyle = {};
