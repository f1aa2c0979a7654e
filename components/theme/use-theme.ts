import { useColorScheme } from 'react-native';
import { darkPalette, lightPalette, type Palette } from './colors';

export interface Theme {
  scheme: 'light' | 'dark';
  colors: Palette;
}

const lightTheme: Theme = { scheme: 'light', colors: lightPalette };
const darkTheme: Theme = { scheme: 'dark', colors: darkPalette };

/** Follows the device's light/dark setting. */
export function useTheme(): Theme {
  return useColorScheme() === 'dark' ? darkTheme : lightTheme;
}
