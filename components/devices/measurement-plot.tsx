import { scaleLinear } from 'd3-scale';
import { line } from 'd3-shape';
import { useState } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import Svg, { Circle, G, Line, Path, Text as SvgText } from 'react-native-svg';
import { MEASUREMENT_AXES, type DeviceMeasurement } from '@/shared/schemas/device';
import { fontFaces, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

const TICK_FONT = typeScale.caption.fontSize ?? 14;
/** The left margin holds tick labels of up to five characters and the turned axis title. */
const MARGIN = { top: space.md, right: space.lg, bottom: space.xxxl, left: space.xxxl + space.xl + space.xs };
/** Readable on a phone without swallowing a wide screen (common practice, no source). */
const MIN_HEIGHT = 200;
const MAX_HEIGHT = 320;
const ASPECT = 0.6;
/** Room around the data so no point sits on an axis. */
const PAD_FRACTION = 0.08;
const POINT_RADIUS = 5;

type XY = { x: number; y: number };

/** [min, max] of some numbers, widened a little (and around a single value) so points sit inside. */
function paddedExtent(values: readonly number[]): [number, number] {
  const low = Math.min(...values);
  const high = Math.max(...values);
  const span = high - low || Math.abs(high) || 1;
  return [low - span * PAD_FRACTION, high + span * PAD_FRACTION];
}

/**
 * Measured rows as points beside the design's prediction: its curve (f ∝ 1/λ) as a line and its
 * reference levels (design focal length, ideal efficiencies) as dashed lines.
 */
export function MeasurementPlot({ measurement }: { measurement: DeviceMeasurement }) {
  const { colors } = useTheme();
  const [width, setWidth] = useState(0);
  const onLayout = (event: LayoutChangeEvent) => setWidth(Math.round(event.nativeEvent.layout.width));
  const axes = MEASUREMENT_AXES[measurement.kind];
  const prediction = measurement.prediction;
  const curve = [...(prediction?.curve ?? [])].sort((a, b) => a.x - b.x);
  const levels = prediction?.levels ?? [];

  const xs = [...measurement.rows.map((row) => row.x), ...curve.map((point) => point.x)];
  const ys = [...measurement.rows.map((row) => row.y), ...curve.map((point) => point.y), ...levels.map((level) => level.y)];
  const height = Math.round(Math.min(MAX_HEIGHT, Math.max(MIN_HEIGHT, width * ASPECT)));
  const innerWidth = Math.max(0, width - MARGIN.left - MARGIN.right);
  const innerHeight = height - MARGIN.top - MARGIN.bottom;
  const x = scaleLinear().domain(paddedExtent(xs)).range([0, innerWidth]).nice();
  const y = scaleLinear().domain(paddedExtent(ys)).range([innerHeight, 0]).nice();
  const xTicks = x.ticks(Math.max(3, Math.floor(innerWidth / 90)));
  const yTicks = y.ticks(5);
  const xFormat = x.tickFormat(xTicks.length);
  const yFormat = y.tickFormat(yTicks.length);
  const path = line<XY>()
    .x((point) => x(point.x))
    .y((point) => y(point.y));
  const tick = { fill: colors.inkMuted, fontSize: TICK_FONT, fontFamily: fontFaces.sansRegular };

  return (
    <View style={styles.stack}>
      <View
        onLayout={onLayout}
        style={{ height }}
        accessibilityRole="image"
        accessibilityLabel={`${axes.title}: ${measurement.rows.length} measured points${prediction ? ' beside the design’s prediction' : ''}. The numbers are in the table.`}
        testID={`measurement-plot-${measurement.id}`}
      >
        {width > 0 ? (
          <Svg width={width} height={height}>
            <G x={MARGIN.left} y={MARGIN.top}>
              {yTicks.map((value) => (
                <G key={`y${value}`}>
                  <Line
                    x1={0}
                    x2={innerWidth}
                    y1={y(value)}
                    y2={y(value)}
                    stroke={colors.hairline}
                    strokeWidth={sizes.hairline}
                  />
                  <SvgText {...tick} x={-space.sm} y={y(value) + TICK_FONT / 3} textAnchor="end">
                    {yFormat(value)}
                  </SvgText>
                </G>
              ))}
              {xTicks.map((value) => (
                <SvgText key={`x${value}`} {...tick} x={x(value)} y={innerHeight + TICK_FONT + space.xs} textAnchor="middle">
                  {xFormat(value)}
                </SvgText>
              ))}
              <Line
                x1={0}
                x2={innerWidth}
                y1={innerHeight}
                y2={innerHeight}
                stroke={colors.outline}
                strokeWidth={sizes.hairline}
              />
              <SvgText {...tick} x={innerWidth / 2} y={innerHeight + TICK_FONT * 2 + space.md} textAnchor="middle">
                {`${axes.x.label} (${axes.x.unit})`}
              </SvgText>
              <SvgText {...tick} x={-(innerHeight / 2)} y={-MARGIN.left + TICK_FONT} textAnchor="middle" transform="rotate(-90)">
                {`${axes.y.label} (${axes.y.unit})`}
              </SvgText>
              {levels.map((level) => (
                <G key={level.label}>
                  <Line
                    x1={0}
                    x2={innerWidth}
                    y1={y(level.y)}
                    y2={y(level.y)}
                    stroke={colors.copper}
                    strokeWidth={1.5}
                    strokeDasharray="6 4"
                  />
                  <SvgText {...tick} fill={colors.copperInk} x={innerWidth - space.xs} y={y(level.y) - space.xs} textAnchor="end">
                    {level.label}
                  </SvgText>
                </G>
              ))}
              {curve.length > 1 ? <Path d={path(curve) ?? ''} fill="none" stroke={colors.copper} strokeWidth={2} /> : null}
              {measurement.rows.map((row, index) => (
                <Circle key={index} cx={x(row.x)} cy={y(row.y)} r={POINT_RADIUS} fill={colors.primary} />
              ))}
            </G>
          </Svg>
        ) : null}
      </View>
      <View style={styles.legend}>
        <Key color={colors.primary} round label="Measured" />
        {prediction ? <Key color={colors.copper} label={`Design: ${prediction.basis}`} /> : null}
      </View>
    </View>
  );
}

function Key({ color, label, round = false }: { color: string; label: string; round?: boolean }) {
  return (
    <View style={styles.key}>
      <View style={[round ? styles.dot : styles.dash, { backgroundColor: color }]} />
      <Text variant="caption">{label}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  key: { flexDirection: 'row', alignItems: 'center', gap: space.xs, flexShrink: 1 },
  dot: { width: POINT_RADIUS * 2, height: POINT_RADIUS * 2, borderRadius: POINT_RADIUS },
  dash: { width: space.lg, height: 2 },
});
