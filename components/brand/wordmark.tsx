import { StyleSheet, View } from 'react-native';
import Svg, { Polygon, Rect } from 'react-native-svg';
import { sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

export const TAGLINE = 'Every flake traced, from tape to device.';

/**
 * The Flakeline mark: a copper flake lying on a violet chip, with its thinnest (monolayer)
 * region picked out lighter — what a researcher hunts for under the microscope.
 */
export function BrandMark({ size = sizes.brandMark }: { size?: number }) {
  const { colors } = useTheme();
  return (
    <Svg width={size} height={size} viewBox="0 0 48 48" accessibilityElementsHidden importantForAccessibility="no">
      <Rect x={3} y={3} width={42} height={42} rx={10} fill={colors.primary} />
      <Polygon points="16,13 30,11 38,22 33,35 19,37 11,26" fill={colors.copper} />
      <Polygon points="24,19 31,20 32,28 26,31 21,26" fill={colors.paper} fillOpacity={0.55} />
    </Svg>
  );
}

export interface WordmarkProps {
  /** large: signed-out screens; regular: the side column. */
  size?: 'regular' | 'large';
  showTagline?: boolean;
}

export function Wordmark({ size = 'regular', showTagline = false }: WordmarkProps) {
  const large = size === 'large';
  return (
    <View style={styles.row} testID="wordmark">
      <BrandMark size={large ? sizes.brandMarkLarge : sizes.brandMark} />
      <View style={styles.words}>
        <Text variant={large ? 'title' : 'heading'} style={styles.name}>
          Flakeline
        </Text>
        {showTagline ? (
          <Text variant="caption" tone="muted">
            {TAGLINE}
          </Text>
        ) : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  words: { flexShrink: 1 },
  name: { letterSpacing: 0.2 },
});
