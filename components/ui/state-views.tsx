import Ionicons from '@expo/vector-icons/Ionicons';
import type { ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { describeError } from '@/hooks/api-client';
import { sizes, space, useTheme } from '@/components/theme';
import { Button, type IconName } from './button';
import { Text } from './text';

/** Shown while the first answer is on its way; says what is loading so the wait has a reason. */
export function LoadingState({ label, fill = false }: { label: string; fill?: boolean }) {
  const { colors } = useTheme();
  return (
    <View
      style={[styles.state, fill && styles.fill]}
      accessibilityRole="progressbar"
      accessibilityLabel={label}
      testID="loading-state"
    >
      <ActivityIndicator color={colors.primary} size="large" />
      <Text tone="muted">{label}</Text>
    </View>
  );
}

export interface ErrorStateProps {
  /** What could not be done, e.g. "Could not load the people in this lab". */
  title: string;
  error: unknown;
  onRetry?: () => void;
  retrying?: boolean;
  /** Fill the whole window (nothing else could be drawn). */
  fill?: boolean;
}

export function ErrorState({ title, error, onRetry, retrying = false, fill = false }: ErrorStateProps) {
  const { colors } = useTheme();
  return (
    <View style={[styles.state, fill && styles.fill]} accessibilityRole="alert" testID="error-state">
      <Ionicons name="cloud-offline-outline" size={sizes.iconLarge} color={colors.danger} />
      <Text variant="heading" style={styles.center}>
        {title}
      </Text>
      <Text tone="muted" style={styles.center}>
        {describeError(error)}
      </Text>
      {onRetry ? (
        // Buttons hug the start edge by default; this wrapper keeps this one centred with the text.
        <View>
          <Button title="Try again" icon="refresh" variant="secondary" loading={retrying} onPress={onRetry} />
        </View>
      ) : null}
    </View>
  );
}

export interface EmptyStateProps {
  icon: IconName;
  title: string;
  /** What to do next. */
  children?: ReactNode;
  action?: ReactNode;
  testID?: string;
}

export function EmptyState({ icon, title, children, action, testID }: EmptyStateProps) {
  const { colors } = useTheme();
  return (
    <View style={styles.state} testID={testID ?? 'empty-state'}>
      <Ionicons name={icon} size={sizes.iconLarge} color={colors.inkMuted} />
      <Text variant="heading" style={styles.center}>
        {title}
      </Text>
      {typeof children === 'string' ? (
        <Text tone="muted" style={styles.center}>
          {children}
        </Text>
      ) : (
        children
      )}
      {action ? <View>{action}</View> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  state: {
    alignItems: 'center',
    justifyContent: 'center',
    gap: space.md,
    paddingVertical: space.xxxl,
    paddingHorizontal: space.lg,
  },
  fill: { flex: 1 },
  center: { textAlign: 'center', maxWidth: sizes.narrowWidth },
});
