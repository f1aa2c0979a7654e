import Head from 'expo-router/head';
import { createContext, use, type ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { useSafeAreaInsets, type Edge } from 'react-native-safe-area-context';
import { sizes, space, useTheme } from '@/components/theme';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { Heading, Text } from './text';

const ALL_EDGES: readonly Edge[] = ['top', 'right', 'bottom', 'left'];

/**
 * Edges a surrounding frame has not already padded. The lab shell's bottom bar or side rail
 * covers one edge itself, so screens inside it must not pad that edge twice.
 */
export const ScreenEdgesContext = createContext<readonly Edge[]>(ALL_EDGES);

export interface ScreenProps {
  /** Shown as the screen's heading and in the browser tab. */
  title: string;
  /** One line under the title saying what the screen is for. */
  lead?: string;
  /** Controls placed beside the title, e.g. a refresh button. */
  actions?: ReactNode;
  /** narrow: sign-in and link screens; reading: forms and text; wide: list and detail side by side. */
  width?: 'narrow' | 'reading' | 'wide';
  /** Shown above the heading, e.g. the wordmark on signed-out screens. */
  above?: ReactNode;
  /** Centres short content vertically (signed-out screens). */
  centered?: boolean;
  /** Off when the content manages its own scrolling (e.g. two scrolling panes). */
  scroll?: boolean;
  testID?: string;
  children: ReactNode;
}

/** The frame of every screen: safe areas, scrolling, a capped content width and the heading. */
const MAX_WIDTHS = { narrow: sizes.narrowWidth, reading: sizes.readingWidth, wide: sizes.wideWidth } as const;

export function Screen({
  title,
  lead,
  actions,
  width = 'reading',
  above,
  centered = false,
  scroll = true,
  testID,
  children,
}: ScreenProps) {
  const { colors } = useTheme();
  const { isPhone } = useBreakpoints();
  const insets = useSafeAreaInsets();
  const edges = use(ScreenEdgesContext);
  const gutter = isPhone ? space.lg : space.xxl;

  const padding = {
    paddingTop: (edges.includes('top') ? insets.top : 0) + (isPhone ? space.xl : space.xxl),
    paddingBottom: (edges.includes('bottom') ? insets.bottom : 0) + space.xxl,
    paddingLeft: (edges.includes('left') ? insets.left : 0) + gutter,
    paddingRight: (edges.includes('right') ? insets.right : 0) + gutter,
  };

  const body = (
    <View style={[styles.column, centered && styles.centered, { maxWidth: MAX_WIDTHS[width] }]}>
      {above}
      <View style={styles.header}>
        <View style={styles.headerText}>
          <Heading level={1}>{title}</Heading>
          {lead ? <Text tone="muted">{lead}</Text> : null}
        </View>
        {actions ? <View style={styles.actions}>{actions}</View> : null}
      </View>
      {children}
    </View>
  );

  return (
    <View style={[styles.fill, { backgroundColor: colors.paper }]} testID={testID}>
      <Head>
        <title>{`${title} · Flakeline`}</title>
      </Head>
      {scroll ? (
        <ScrollView
          style={styles.fill}
          contentContainerStyle={[styles.scrollContent, padding]}
          keyboardShouldPersistTaps="handled"
        >
          {body}
        </ScrollView>
      ) : (
        <View style={[styles.fill, padding]}>{body}</View>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  fill: { flex: 1 },
  scrollContent: { flexGrow: 1 },
  column: { width: '100%', alignSelf: 'center', gap: space.xl, flexGrow: 1 },
  centered: { justifyContent: 'center' },
  header: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-start', gap: space.lg },
  headerText: { flexGrow: 1, flexShrink: 1, flexBasis: 240, gap: space.xs },
  actions: { flexDirection: 'row', gap: space.sm },
});
