import Ionicons from '@expo/vector-icons/Ionicons';
import type { ComponentProps } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View, type PressableProps } from 'react-native';
import { radii, sizes, space, typeScale, useTheme, type Palette } from '@/components/theme';
import { Text } from './text';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';
export type IconName = ComponentProps<typeof Ionicons>['name'];

interface VariantColors {
  background: keyof Palette | null;
  pressed: keyof Palette;
  text: keyof Palette;
  border: keyof Palette | null;
}

const VARIANTS: Record<ButtonVariant, VariantColors> = {
  primary: { background: 'primary', pressed: 'primaryPressed', text: 'onPrimary', border: null },
  secondary: { background: 'surface', pressed: 'sunken', text: 'primary', border: 'outline' },
  danger: { background: 'danger', pressed: 'dangerPressed', text: 'onDanger', border: null },
  quiet: { background: null, pressed: 'sunken', text: 'primary', border: null },
};

export interface ButtonProps extends Omit<PressableProps, 'children' | 'style'> {
  title: string;
  variant?: ButtonVariant;
  icon?: IconName;
  /** Shows a spinner and ignores presses while a request is on its way. */
  loading?: boolean;
  /** Stretch to the width of the container (phones, single-column forms). */
  block?: boolean;
}

export function Button({
  title,
  variant = 'primary',
  icon,
  loading = false,
  disabled = false,
  block = false,
  accessibilityLabel,
  ...rest
}: ButtonProps) {
  const { colors } = useTheme();
  const look = VARIANTS[variant];
  const inactive = disabled || loading;
  const textColor = colors[look.text];

  return (
    // Props from a wrapping <Link asChild> (href, role, onClick) arrive in `rest`; our look wins.
    <Pressable
      {...rest}
      accessibilityRole="button"
      accessibilityLabel={accessibilityLabel ?? title}
      accessibilityState={{ disabled: inactive, busy: loading }}
      disabled={inactive}
      style={({ pressed }) => [
        styles.base,
        block && styles.block,
        look.background ? { backgroundColor: colors[pressed ? look.pressed : look.background] } : null,
        !look.background && pressed ? { backgroundColor: colors[look.pressed] } : null,
        look.border ? { borderWidth: sizes.outline, borderColor: colors[look.border] } : null,
        variant === 'quiet' && styles.quiet,
        disabled && !loading && styles.disabled,
      ]}
    >
      <View style={styles.content}>
        {loading ? (
          <ActivityIndicator size="small" color={textColor} />
        ) : icon ? (
          <Ionicons name={icon} size={sizes.iconSmall} color={textColor} />
        ) : null}
        <Text variant="label" style={[styles.label, { color: textColor }]} numberOfLines={1}>
          {title}
        </Text>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    minHeight: sizes.touchTarget,
    paddingHorizontal: space.xl,
    borderRadius: radii.md,
    justifyContent: 'center',
    alignItems: 'center',
    alignSelf: 'flex-start',
  },
  block: { alignSelf: 'stretch' },
  quiet: { paddingHorizontal: space.md },
  disabled: { opacity: 0.5 },
  content: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  label: { lineHeight: typeScale.label.lineHeight },
});
