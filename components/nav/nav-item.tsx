import Ionicons from '@expo/vector-icons/Ionicons';
import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { fontFaces, radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';
import type { Destination } from './destinations';

export type NavItemShape = 'tab' | 'rail' | 'row';

export interface NavItemProps {
  destination: Destination;
  current: boolean;
  /** tab: bottom bar; rail: icon over label in a narrow column; row: icon beside label. */
  shape: NavItemShape;
}

/**
 * One destination, as a real link (an <a> on the web) marked as the current page when it is.
 * The Pressable under <Link asChild> takes only a flat style object (the Slot merges by
 * spreading), so the pressed look is drawn by an inner view.
 */
export function NavItem({ destination, current, shape }: NavItemProps) {
  const { colors } = useTheme();
  const tint = current ? colors.onPrimarySoft : colors.inkMuted;
  const stacked = shape !== 'row';

  return (
    <Link href={destination.href} asChild>
      <Pressable
        testID={`nav-${destination.key}`}
        accessibilityLabel={destination.label}
        aria-current={current ? 'page' : undefined}
        style={shape === 'tab' ? styles.tabTarget : styles.target}
      >
        {({ pressed }) => (
          <View
            style={[
              styles.inner,
              stacked ? styles.stacked : styles.row,
              !stacked && { backgroundColor: current ? colors.primarySoft : pressed ? colors.sunken : 'transparent' },
            ]}
          >
            <View
              style={[
                stacked && styles.iconPill,
                stacked && (current || pressed) ? { backgroundColor: current ? colors.primarySoft : colors.sunken } : null,
              ]}
            >
              <Ionicons name={current ? destination.activeIcon : destination.icon} size={sizes.icon} color={tint} />
            </View>
            <Text
              variant={stacked ? 'caption' : 'label'}
              numberOfLines={1}
              style={[
                { color: current ? (stacked ? colors.ink : colors.onPrimarySoft) : colors.inkMuted },
                current && styles.currentLabel,
              ]}
            >
              {destination.label}
            </Text>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

const PILL_WIDTH = space.xxl * 2;

const styles = StyleSheet.create({
  target: { minHeight: sizes.touchTarget },
  tabTarget: { flex: 1, minHeight: sizes.touchTarget },
  inner: { flexGrow: 1, minHeight: sizes.touchTarget, alignItems: 'center' },
  stacked: { justifyContent: 'center', gap: space.xs, paddingVertical: space.sm },
  row: {
    flexDirection: 'row',
    gap: space.md,
    paddingHorizontal: space.lg,
    borderRadius: radii.md,
  },
  iconPill: {
    width: PILL_WIDTH,
    paddingVertical: space.xs,
    borderRadius: radii.pill,
    alignItems: 'center',
  },
  currentLabel: { fontFamily: fontFaces.sansSemiBold },
});
