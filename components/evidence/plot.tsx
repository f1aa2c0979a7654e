import { scaleLinear, type ScaleLinear } from 'd3-scale';
import { useId, type ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { ClipPath, Defs, G, Line, Rect, Text as SvgText } from 'react-native-svg';
import { fontFaces, space, typeScale, useTheme } from '@/components/theme';
import { useLayoutWidth } from './use-layout-width';

export interface PlotAxis {
  domain: readonly [number, number];
  label: string;
  /** Roughly how many ticks; d3 picks round values near this count. */
  ticks?: number;
  format?: (value: number) => string;
}

export interface PlotScales {
  x: ScaleLinear<number, number>;
  y: ScaleLinear<number, number>;
  /** Size of the drawing area inside the axes. */
  innerWidth: number;
  innerHeight: number;
}

export interface PlotProps {
  x: PlotAxis;
  y: PlotAxis;
  /** Height as a fraction of width, within the limits below. */
  aspect?: number;
  /** What the plot shows, for screen readers (the numbers are also in a table nearby). */
  accessibilityLabel: string;
  testID?: string;
  children: (scales: PlotScales) => ReactNode;
}

const TICK_FONT = typeScale.caption.fontSize ?? 14;
const MARGIN = { top: space.md, right: space.lg, bottom: space.xxxl, left: space.xxxl + space.md };
/** A plot stays readable on a phone and does not swallow a wide screen (common practice, no source). */
const MIN_HEIGHT = 200;
const MAX_HEIGHT = 360;

/** Axes, ticks and a clipped drawing area; the caller draws the data with the scales it is given. */
export function Plot({ x, y, aspect = 0.62, accessibilityLabel, testID, children }: PlotProps) {
  const theme = useTheme();
  const { colors } = theme;
  const { width, onLayout } = useLayoutWidth();
  const clipId = `plot-clip-${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  const height = Math.round(Math.min(MAX_HEIGHT, Math.max(MIN_HEIGHT, width * aspect)));
  const innerWidth = Math.max(0, width - MARGIN.left - MARGIN.right);
  const innerHeight = height - MARGIN.top - MARGIN.bottom;
  const xScale = scaleLinear()
    .domain([...x.domain])
    .range([0, innerWidth]);
  const yScale = scaleLinear()
    .domain([...y.domain])
    .range([innerHeight, 0]);
  const xTicks = xScale.ticks(x.ticks ?? Math.max(3, Math.floor(innerWidth / 80)));
  const yTicks = yScale.ticks(y.ticks ?? 5);
  const xFormat = x.format ?? xScale.tickFormat(x.ticks ?? 6);
  const yFormat = y.format ?? yScale.tickFormat(y.ticks ?? 5);
  const tickText = { fill: colors.inkMuted, fontSize: TICK_FONT, fontFamily: fontFaces.sansRegular };

  return (
    <View
      onLayout={onLayout}
      style={[styles.box, { height }]}
      accessibilityRole="image"
      accessibilityLabel={accessibilityLabel}
      testID={testID}
    >
      {width > 0 ? (
        <Svg width={width} height={height}>
          <Defs>
            <ClipPath id={clipId}>
              <Rect x={0} y={0} width={innerWidth} height={innerHeight} />
            </ClipPath>
          </Defs>
          <G x={MARGIN.left} y={MARGIN.top}>
            {yTicks.map((tick) => (
              <G key={`y${tick}`}>
                <Line x1={0} x2={innerWidth} y1={yScale(tick)} y2={yScale(tick)} stroke={colors.hairline} strokeWidth={1} />
                <SvgText {...tickText} x={-space.sm} y={yScale(tick) + TICK_FONT / 3} textAnchor="end">
                  {yFormat(tick)}
                </SvgText>
              </G>
            ))}
            {xTicks.map((tick) => (
              <SvgText key={`x${tick}`} {...tickText} x={xScale(tick)} y={innerHeight + TICK_FONT + space.xs} textAnchor="middle">
                {xFormat(tick)}
              </SvgText>
            ))}
            <Line x1={0} x2={innerWidth} y1={innerHeight} y2={innerHeight} stroke={colors.outline} strokeWidth={1} />
            <Line x1={0} x2={0} y1={0} y2={innerHeight} stroke={colors.outline} strokeWidth={1} />
            <SvgText
              {...tickText}
              fill={colors.ink}
              x={innerWidth / 2}
              y={innerHeight + 2 * TICK_FONT + space.sm}
              textAnchor="middle"
            >
              {x.label}
            </SvgText>
            <SvgText
              {...tickText}
              fill={colors.ink}
              x={-innerHeight / 2}
              y={-MARGIN.left + TICK_FONT}
              textAnchor="middle"
              transform="rotate(-90)"
            >
              {y.label}
            </SvgText>
            <G clipPath={`url(#${clipId})`}>{children({ x: xScale, y: yScale, innerWidth, innerHeight })}</G>
          </G>
        </Svg>
      ) : null}
    </View>
  );
}

/** A padded domain around some values, so lines do not run along the frame. */
export function paddedDomain(values: readonly number[], fraction = 0.08): [number, number] {
  const finite = values.filter(Number.isFinite);
  if (finite.length === 0) return [0, 1];
  let low = Math.min(...finite);
  let high = Math.max(...finite);
  if (low === high) {
    low -= 1;
    high += 1;
  }
  const pad = (high - low) * fraction;
  return [low - pad, high + pad];
}

const styles = StyleSheet.create({
  box: { alignSelf: 'stretch' },
});
