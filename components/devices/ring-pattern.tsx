import { useState } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import Svg, { Circle, G, Line, Rect, Text as SvgText } from 'react-native-svg';
import { formatLengthUm, isEtchedZone, plural, ringPattern, type ZonePlateDesign } from '@/shared/zone-plate';
import { fontFaces, radii, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';
import { formatFineLength } from './lens-figures';
import { planRingDrawing } from './ring-drawing';

/** Largest drawing of the whole lens; bigger only shows the same rings larger (common practice, no source). */
const MAX_PATTERN_PX = 360;
/** Zones shown side by side in the close-up of the rim. */
const RIM_ZONES = 12;
const RIM_HEIGHT = 56;
const TICK_FONT = typeScale.caption.fontSize ?? 14;

/**
 * The ring pattern the lithography writes, as seen from above: the flake that stays (dark) and the
 * etched zones (light). Fine outer rings become a half-tone band; a close-up of the rim shows them.
 */
export function RingPattern({ design }: { design: ZonePlateDesign }) {
  const { colors } = useTheme();
  const [width, setWidth] = useState(0);
  const onLayout = (event: LayoutChangeEvent) => setWidth(Math.round(event.nativeEvent.layout.width));
  const size = Math.min(width, MAX_PATTERN_PX);
  const pattern = ringPattern(design.zones, design.etchedZones);
  const radiusPx = size / 2;
  const drawing = planRingDrawing(pattern, design.zoneCount, radiusPx);
  const lensRadius = pattern.lensRadiusUm;
  const kept = colors.primary;
  const etched = colors.primarySoft;

  return (
    <View style={styles.stack} onLayout={onLayout} testID="lens-ring-pattern">
      {size > 0 ? (
        <View
          style={styles.centre}
          accessibilityRole="image"
          accessibilityLabel={`Ring pattern: ${plural(design.zoneCount, 'zone', 'zones')}, ${formatLengthUm(design.lensDiameterUm)} across, ${design.etchedZones} zones etched`}
        >
          <Svg width={size} height={size} viewBox={`${-lensRadius} ${-lensRadius} ${2 * lensRadius} ${2 * lensRadius}`}>
            <Circle cx={0} cy={0} r={lensRadius} fill={kept} />
            {drawing.rings.map((ring) => (
              <Circle key={ring.zone} cx={0} cy={0} r={ring.midRadiusUm} fill="none" stroke={etched} strokeWidth={ring.widthUm} />
            ))}
            {drawing.fineBand ? (
              <Circle
                cx={0}
                cy={0}
                r={(drawing.fineBand.innerRadiusUm + drawing.fineBand.outerRadiusUm) / 2}
                fill="none"
                stroke={etched}
                strokeOpacity={0.5}
                strokeWidth={drawing.fineBand.outerRadiusUm - drawing.fineBand.innerRadiusUm}
              />
            ) : null}
          </Svg>
        </View>
      ) : null}
      <View style={styles.legend}>
        <Swatch color={kept} label="Flake kept" />
        <Swatch color={etched} label={`Etched (${design.etchedZones} zones)`} />
      </View>
      {drawing.fineBand ? (
        <Text variant="caption" tone="muted" testID="lens-ring-fine-note">
          {`The outer ${plural(drawing.fineBand.zoneCount, 'zone is', 'zones are')} finer than a screen pixel at this size and ${drawing.fineBand.zoneCount === 1 ? 'is' : 'are'} drawn as a half-tone band; the close-up below shows the rim at true proportions.`}
        </Text>
      ) : null}
      {size > 0 ? <RimCloseUp design={design} width={Math.min(width, MAX_PATTERN_PX * 1.5)} /> : null}
    </View>
  );
}

/** The outermost zones as stripes, radius growing to the right, with the radii at both ends. */
function RimCloseUp({ design, width }: { design: ZonePlateDesign; width: number }) {
  const { colors } = useTheme();
  const zones = design.zones.slice(-RIM_ZONES);
  const first = zones[0];
  const last = zones[zones.length - 1];
  if (!first || !last) return null;
  const from = first.innerRadiusUm;
  const span = last.outerRadiusUm - from;
  const x = (radiusUm: number) => ((radiusUm - from) / span) * width;
  const tick = { fill: colors.inkMuted, fontSize: TICK_FONT, fontFamily: fontFaces.sansRegular };
  return (
    <View
      style={styles.rim}
      accessibilityRole="image"
      accessibilityLabel={`Close-up of the outermost ${zones.length} zones, from radius ${formatLengthUm(from)} to ${formatLengthUm(last.outerRadiusUm)}`}
      testID="lens-rim-close-up"
    >
      <Text variant="caption" tone="muted">
        {`Rim close-up: zones ${first.zone}–${last.zone}, outermost ${formatFineLength(last.widthUm)} wide`}
      </Text>
      <Svg width={width} height={RIM_HEIGHT + TICK_FONT + space.sm}>
        <G>
          {zones.map((zone) => (
            <Rect
              key={zone.zone}
              x={x(zone.innerRadiusUm)}
              y={0}
              width={Math.max(0, x(zone.outerRadiusUm) - x(zone.innerRadiusUm))}
              height={RIM_HEIGHT}
              fill={isEtchedZone(zone.zone, design.etchedZones) ? colors.primarySoft : colors.primary}
            />
          ))}
          <Line x1={0} x2={width} y1={RIM_HEIGHT} y2={RIM_HEIGHT} stroke={colors.outline} strokeWidth={sizes.hairline} />
          <SvgText {...tick} x={0} y={RIM_HEIGHT + TICK_FONT + space.xs} textAnchor="start">
            {`r = ${formatLengthUm(from)}`}
          </SvgText>
          <SvgText {...tick} x={width} y={RIM_HEIGHT + TICK_FONT + space.xs} textAnchor="end">
            {`r = ${formatLengthUm(last.outerRadiusUm)}`}
          </SvgText>
        </G>
      </Svg>
    </View>
  );
}

function Swatch({ color, label }: { color: string; label: string }) {
  const { colors } = useTheme();
  return (
    <View style={styles.swatchRow}>
      <View style={[styles.swatch, { backgroundColor: color, borderColor: colors.outline }]} />
      <Text variant="caption">{label}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md, alignSelf: 'stretch' },
  centre: { alignItems: 'center' },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg, justifyContent: 'center' },
  swatchRow: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: space.lg, height: space.lg, borderRadius: radii.sm, borderWidth: sizes.hairline },
  rim: { gap: space.xs, alignSelf: 'center' },
});
