import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { Text } from './text';

/** A read-only value with its label above, matching the layout of editable fields. */
export function DetailRow({ label, children, testID }: { label: string; children: ReactNode; testID?: string }) {
  return (
    <View style={styles.row} testID={testID}>
      <Text variant="caption" tone="muted">
        {label}
      </Text>
      {typeof children === 'string' ? <Text selectable>{children}</Text> : children}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xxs },
});
