import { usePathname } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { useSafeAreaInsets, type Edge } from 'react-native-safe-area-context';
import type { User } from '@/shared/schemas/user';
import { BrandMark, Wordmark } from '@/components/brand/wordmark';
import { sizes, space, useTheme } from '@/components/theme';
import { RoleBadge } from '@/components/ui/badges';
import { ScreenEdgesContext } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { destinationsFor, isCurrent, type Destination } from './destinations';
import { NavItem } from './nav-item';

const BAR_EDGES: readonly Edge[] = ['top', 'left', 'right'];
const SIDE_EDGES: readonly Edge[] = ['top', 'right', 'bottom'];

export interface LabShellProps {
  /** Undefined while the session is still being checked. */
  user: User | undefined;
  /** Shown instead of the screen (e.g. "checking who is signed in"); the screen stays mounted, hidden. */
  cover?: ReactNode;
  children: ReactNode;
}

/**
 * The signed-in frame: one navigation, drawn as a bottom bar on phones, a compact rail on
 * tablets and a labelled column on wide screens, around whichever lab screen is open.
 * The screen's route is always rendered, because expo-router drops a deep link whose layout
 * renders no navigator.
 */
export function LabShell({ user, cover, children }: LabShellProps) {
  const { colors } = useTheme();
  const { navLayout } = useBreakpoints();
  const pathname = usePathname();
  const destinations = user ? destinationsFor(user.role) : [];
  const isBar = navLayout === 'bar';
  const showNav = user !== undefined && !cover;

  return (
    <View style={[styles.shell, isBar ? styles.column : styles.row, { backgroundColor: colors.paper }]}>
      {showNav && !isBar ? (
        <SideNav user={user} destinations={destinations} pathname={pathname} compact={navLayout === 'rail'} />
      ) : null}
      <View style={styles.main} role="main">
        <View style={[styles.main, cover ? styles.hidden : null]}>
          <ScreenEdgesContext.Provider value={isBar ? BAR_EDGES : SIDE_EDGES}>{children}</ScreenEdgesContext.Provider>
        </View>
        {cover}
      </View>
      {showNav && isBar ? <BottomBar destinations={destinations} pathname={pathname} /> : null}
    </View>
  );
}

interface NavListProps {
  destinations: Destination[];
  pathname: string;
}

function BottomBar({ destinations, pathname }: NavListProps) {
  const { colors } = useTheme();
  const insets = useSafeAreaInsets();
  return (
    <View
      role="navigation"
      accessibilityLabel="Lab sections"
      testID="nav-bar"
      style={[
        styles.bar,
        {
          backgroundColor: colors.surface,
          borderTopColor: colors.hairline,
          paddingBottom: insets.bottom,
          paddingLeft: insets.left,
          paddingRight: insets.right,
        },
      ]}
    >
      {destinations.map((destination) => (
        <NavItem key={destination.key} destination={destination} current={isCurrent(destination, pathname)} shape="tab" />
      ))}
    </View>
  );
}

function SideNav({ user, destinations, pathname, compact }: NavListProps & { user: User; compact: boolean }) {
  const { colors } = useTheme();
  const insets = useSafeAreaInsets();
  return (
    <View
      role="navigation"
      accessibilityLabel="Lab sections"
      testID={compact ? 'nav-rail' : 'nav-column'}
      style={[
        styles.side,
        compact ? styles.rail : styles.sideColumn,
        {
          backgroundColor: colors.surface,
          borderRightColor: colors.hairline,
          paddingTop: insets.top + space.xl,
          paddingBottom: insets.bottom + space.lg,
          paddingLeft: insets.left + (compact ? space.sm : space.lg),
        },
      ]}
    >
      <View style={[styles.brand, compact && styles.brandCompact]}>{compact ? <BrandMark /> : <Wordmark showTagline />}</View>
      <View style={styles.items}>
        {destinations.map((destination) => (
          <NavItem
            key={destination.key}
            destination={destination}
            current={isCurrent(destination, pathname)}
            shape={compact ? 'rail' : 'row'}
          />
        ))}
      </View>
      {compact ? null : (
        <View style={[styles.signedIn, { borderTopColor: colors.hairline }]} testID="nav-signed-in">
          <Text variant="caption" tone="muted">
            Signed in as
          </Text>
          <Text variant="label" numberOfLines={1}>
            {user.displayName}
          </Text>
          <RoleBadge role={user.role} />
        </View>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  shell: { flex: 1 },
  column: { flexDirection: 'column' },
  row: { flexDirection: 'row' },
  main: { flex: 1 },
  hidden: { display: 'none' },
  bar: {
    flexDirection: 'row',
    borderTopWidth: sizes.hairline,
    paddingTop: space.xs,
  },
  side: { borderRightWidth: sizes.hairline, gap: space.xl },
  rail: { width: sizes.navRailWidth, paddingRight: space.sm },
  sideColumn: { width: sizes.navColumnWidth, paddingRight: space.lg },
  brand: { paddingHorizontal: space.sm },
  brandCompact: { alignItems: 'center', paddingHorizontal: 0 },
  items: { gap: space.xs, flex: 1 },
  signedIn: { borderTopWidth: sizes.hairline, paddingTop: space.lg, paddingHorizontal: space.sm, gap: space.xs },
});
