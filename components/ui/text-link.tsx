import { Link, type Href } from 'expo-router';
import { StyleSheet } from 'react-native';
import { sizes, typeScale, useTheme } from '@/components/theme';

export interface TextLinkProps {
  href: Href;
  children: string;
  testID?: string;
  /** Opens outside the app (e.g. links inside captured e-mails). */
  external?: boolean;
}

/** An underlined link with a full-height touch area, rendered as a real <a> on the web. */
export function TextLink({ href, children, testID, external = false }: TextLinkProps) {
  const { colors } = useTheme();
  return (
    <Link
      href={href}
      testID={testID}
      target={external ? '_blank' : undefined}
      rel={external ? 'noopener noreferrer' : undefined}
      style={[typeScale.label, styles.link, { color: colors.primary }]}
    >
      {children}
    </Link>
  );
}

const styles = StyleSheet.create({
  link: {
    textDecorationLine: 'underline',
    paddingVertical: (sizes.touchTarget - (typeScale.label.lineHeight ?? 0)) / 2,
    alignSelf: 'flex-start',
  },
});
