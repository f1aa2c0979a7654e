import { Text as NativeText, type TextProps as NativeTextProps } from 'react-native';
import { typeScale, useTheme, type Palette, type TextVariant } from '@/components/theme';

export type TextTone = 'default' | 'muted' | 'primary' | 'copper' | 'danger';

const TONE_COLORS: Record<TextTone, keyof Palette> = {
  default: 'ink',
  muted: 'inkMuted',
  primary: 'primary',
  copper: 'copperInk',
  danger: 'danger',
};

export interface TextProps extends NativeTextProps {
  variant?: TextVariant;
  tone?: TextTone;
}

export function Text({ variant = 'body', tone = 'default', style, ...rest }: TextProps) {
  const { colors } = useTheme();
  return <NativeText style={[typeScale[variant], { color: colors[TONE_COLORS[tone]] }, style]} {...rest} />;
}

export interface HeadingProps extends Omit<TextProps, 'variant' | 'accessibilityRole'> {
  /** 1 for the screen's title, 2 for sections, 3 for items within a section. */
  level: 1 | 2 | 3;
}

const HEADING_VARIANTS: Record<HeadingProps['level'], TextVariant> = { 1: 'title', 2: 'heading', 3: 'label' };

/** A heading that assistive technology (and end-to-end tests) can find by role and level. */
export function Heading({ level, ...rest }: HeadingProps) {
  return <Text variant={HEADING_VARIANTS[level]} accessibilityRole="header" aria-level={level} {...rest} />;
}
