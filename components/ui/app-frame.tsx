import type { ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, View } from 'react-native';
import { useTheme } from '@/components/theme';

/**
 * The page colour behind everything, with a quiet spinner until `ready`. The app stays mounted
 * (hidden) meanwhile: expo-router loses a deep link such as /people?person=3 if the layout
 * renders no navigator on its first render.
 */
export function AppFrame({ ready, children }: { ready: boolean; children: ReactNode }) {
  const { colors } = useTheme();
  return (
    <View style={[styles.fill, { backgroundColor: colors.paper }]}>
      <View style={[styles.fill, !ready && styles.hidden]}>{children}</View>
      {ready ? null : (
        <View style={styles.waiting} accessibilityRole="progressbar" accessibilityLabel="Starting Flakeline">
          <ActivityIndicator color={colors.primary} size="large" />
        </View>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  hidden: { display: 'none' },
  waiting: { flex: 1, alignItems: 'center', justifyContent: 'center' },
});
