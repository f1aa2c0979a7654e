import { StyleSheet, View } from 'react-native';
import QRCode from 'react-native-qrcode-svg';
import { lightPalette, radii, sizes, space } from '@/components/theme';
import { recordUrl } from './record-url';

/**
 * Printed labels are dark on light, and some phone scanners read nothing else, so the code on
 * screen keeps those colours in the dark scheme too (on its own light tile).
 */
const QR_DARK = lightPalette.ink;
const QR_LIGHT = lightPalette.surface;
/**
 * The QR standard asks for a margin of four modules (ISO/IEC 18004, "quiet zone"). A record's
 * address makes a 29-module code, so at the sizes used here (up to 160 px) four modules are at
 * most 22 px: the quiet zone plus the tile's padding cover that.
 */
const QUIET_ZONE = space.lg + space.xs;

export interface RecordQrProps {
  code: string;
  size: number;
  testID?: string;
}

/** The record's QR code, carrying the same `<origin>/s/<code>` address as its printed label. */
export function RecordQr({ code, size, testID }: RecordQrProps) {
  const url = recordUrl(code);
  return (
    <View
      style={[styles.tile, { backgroundColor: QR_LIGHT, borderColor: lightPalette.hairline }]}
      testID={testID}
      accessibilityRole="image"
      accessibilityLabel={`QR code for ${code}: ${url}`}
    >
      <QRCode value={url} size={size} ecl="Q" color={QR_DARK} backgroundColor={QR_LIGHT} quietZone={QUIET_ZONE} />
    </View>
  );
}

const styles = StyleSheet.create({
  tile: { padding: space.xs, borderRadius: radii.md, borderWidth: sizes.hairline, alignSelf: 'flex-start' },
});
