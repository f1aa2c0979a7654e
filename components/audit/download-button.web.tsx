import Ionicons from '@expo/vector-icons/Ionicons';
import type { ComponentType } from 'react';
import { Pressable, StyleSheet, View, type PressableProps } from 'react-native';
import { radii, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';
import type { DownloadButtonProps } from './download-button';

export type { DownloadButtonProps } from './download-button';

/**
 * react-native-web renders a pressable with `href` as an <a> (when its role is not "button") and
 * passes `hrefAttrs.download` through; React Native's types know neither prop.
 */
const Anchor = Pressable as unknown as ComponentType<PressableProps & { href: string; hrefAttrs: { download: string } }>;

/**
 * A real link with the `download` attribute, drawn like a button: the browser saves the file
 * itself, with the session cookie, and the page stays where it is.
 */
export function DownloadButton({
  href,
  fileName,
  title,
  icon = 'download-outline',
  variant = 'secondary',
  disabled,
  testID,
}: DownloadButtonProps) {
  const { colors } = useTheme();
  // A disabled download is an ordinary disabled button: there is nothing to fetch yet.
  if (disabled) return <Button title={title} icon={icon} variant={variant} disabled testID={testID} />;
  const primary = variant === 'primary';
  const text = primary ? colors.onPrimary : colors.primary;
  return (
    <Anchor
      href={href}
      hrefAttrs={{ download: fileName }}
      accessibilityRole="link"
      accessibilityLabel={`${title} (downloads a file)`}
      testID={testID}
      style={({ pressed }) => [
        styles.base,
        primary
          ? { backgroundColor: pressed ? colors.primaryPressed : colors.primary }
          : {
              backgroundColor: pressed ? colors.sunken : colors.surface,
              borderWidth: sizes.outline,
              borderColor: colors.outline,
            },
      ]}
    >
      <View style={styles.content}>
        <Ionicons name={icon} size={sizes.iconSmall} color={text} />
        <Text variant="label" style={[styles.label, { color: text }]} numberOfLines={1}>
          {title}
        </Text>
      </View>
    </Anchor>
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
    textDecorationLine: 'none',
  },
  content: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  label: { lineHeight: typeScale.label.lineHeight },
});
