import type { ReactNode } from 'react';
import { StyleSheet, View, type ViewProps } from 'react-native';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Heading, Text } from './text';

export interface CardProps extends ViewProps {
  title?: string;
  /** One line under the title. */
  lead?: string;
  children?: ReactNode;
}

/** A white sheet on the paper background that groups one task or one record. */
export function Card({ title, lead, children, style, ...rest }: CardProps) {
  const { colors } = useTheme();
  return (
    <View style={[styles.card, { backgroundColor: colors.surface, borderColor: colors.hairline }, style]} {...rest}>
      {title ? (
        <View style={styles.heading}>
          <Heading level={2}>{title}</Heading>
          {lead ? <Text tone="muted">{lead}</Text> : null}
        </View>
      ) : null}
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    borderRadius: radii.lg,
    borderWidth: sizes.hairline,
    padding: space.xl,
    gap: space.lg,
  },
  heading: { gap: space.xs },
});
