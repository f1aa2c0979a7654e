import { useWindowDimensions } from 'react-native';
import { breakpoints } from '@/components/theme';

/** bar: bottom tab bar (phones); rail: compact icon rail (tablets); column: labelled side column. */
export type NavLayout = 'bar' | 'rail' | 'column';

export interface Breakpoints {
  width: number;
  isPhone: boolean;
  isMedium: boolean;
  isWide: boolean;
  navLayout: NavLayout;
}

export function useBreakpoints(): Breakpoints {
  const { width } = useWindowDimensions();
  const isPhone = width < breakpoints.medium;
  const isWide = width >= breakpoints.wide;
  const isMedium = !isPhone && !isWide;
  const navLayout: NavLayout = isPhone ? 'bar' : isWide ? 'column' : 'rail';
  return { width, isPhone, isMedium, isWide, navLayout };
}
