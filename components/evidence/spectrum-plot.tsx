import { line } from 'd3-shape';
import { View, StyleSheet } from 'react-native';
import { G, Line, Path, Text as SvgText } from 'react-native-svg';
import { baselineAt } from '@/shared/evidence/baseline';
import { peakCurve, windowCurve, type CurvePoint } from '@/shared/evidence/curves';
import type { FittedPeak, SpectrumWindowFit } from '@/shared/schemas/evidence-analysis';
import { fontFaces, space, typeScale, useTheme } from '@/components/theme';
import { formatNumber } from './number-text';
import { PlotLegend } from './plot-legend';
import { thinForDrawing } from './plot-thinning';
import { paddedDomain, Plot } from './plot';

export interface SpectrumPlotProps {
  x: readonly number[];
  y: readonly number[];
  windows: readonly SpectrumWindowFit[];
  peaks: readonly FittedPeak[];
  /** The stretch of x shown. */
  range: readonly [number, number];
  xLabel: string;
  accessibilityLabel: string;
  testID?: string;
}

const LABEL_FONT = typeScale.caption.fontSize ?? 14;
/** The measured spectrum, the fitted curve (baseline plus Lorentzians, recomputed here) and each fitted peak. */
export function SpectrumPlot({ x, y, windows, peaks, range, xLabel, accessibilityLabel, testID }: SpectrumPlotProps) {
  const theme = useTheme();
  const { colors } = theme;
  const measured: CurvePoint[] = [];
  for (let i = 0; i < x.length; i += 1) if (x[i] >= range[0] && x[i] <= range[1]) measured.push({ x: x[i], y: y[i] });
  const fitted = windows
    .map((window) => windowCurve(window, peaks))
    .map((curve) => curve.filter((point) => point.x >= range[0] && point.x <= range[1]));
  const shown = peaks.filter((peak) => peak.centre >= range[0] && peak.centre <= range[1]);
  const single = shown.map((peak) => {
    const window = windows.find((candidate) => peak.centre >= candidate.fromX && peak.centre <= candidate.toX);
    return window ? peakCurve(window, peak) : [];
  });
  const [low, high] = paddedDomain([...measured.map((point) => point.y), ...fitted.flat().map((point) => point.y)], 0.05);
  // Room above the tallest peak for the two staggered rows of peak names.
  const yDomain: [number, number] = [low, high + (high - low) * 0.25];
  const path = (xScale: (value: number) => number, yScale: (value: number) => number) =>
    line<CurvePoint>()
      .x((point) => xScale(point.x))
      .y((point) => yScale(point.y));

  return (
    <View style={styles.stack}>
      <Plot
        x={{ domain: range, label: xLabel }}
        y={{ domain: yDomain, label: 'Intensity', format: (value) => compactNumber(value) }}
        accessibilityLabel={accessibilityLabel}
        testID={testID}
      >
        {({ x: xScale, y: yScale, innerWidth }) => {
          const draw = path(xScale, yScale);
          return (
            <>
              <Path d={draw(thinForDrawing(measured, innerWidth)) ?? ''} stroke={colors.inkMuted} strokeWidth={1} fill="none" />
              {single.map((curve, i) => (
                <Path
                  key={`peak-${shown[i].centre}`}
                  d={draw(curve) ?? ''}
                  stroke={colors.copper}
                  strokeWidth={1.5}
                  strokeDasharray="5 3"
                  fill="none"
                />
              ))}
              {fitted.map((curve, i) => (
                <Path
                  key={`fit-${windows[i].fromX}`}
                  d={draw(curve) ?? ''}
                  stroke={colors.primary}
                  strokeWidth={2.5}
                  fill="none"
                />
              ))}
              {shown.map((peak, i) => {
                const px = xScale(peak.centre);
                // Neighbouring labels alternate in height so close modes (E¹2g and A1g) stay readable.
                const labelY = LABEL_FONT + (i % 2) * (LABEL_FONT + space.xs);
                return (
                  <G key={`label-${peak.centre}`}>
                    <Line
                      x1={px}
                      x2={px}
                      y1={labelY + space.xs}
                      y2={yScale(peakTop(peak, windows))}
                      stroke={colors.outline}
                      strokeWidth={1}
                      strokeDasharray="2 3"
                    />
                    <SvgText
                      x={px}
                      y={labelY}
                      fill={colors.ink}
                      fontSize={LABEL_FONT}
                      fontFamily={fontFaces.sansMedium}
                      textAnchor="middle"
                    >
                      {peak.label ?? formatNumber(peak.centre, 4)}
                    </SvgText>
                  </G>
                );
              })}
            </>
          );
        }}
      </Plot>
      <PlotLegend
        entries={[
          { label: 'Measured', colour: colors.inkMuted },
          { label: 'Fit (baseline + peaks)', colour: colors.primary },
          { label: 'Each fitted peak', colour: colors.copper, dashed: true },
        ]}
      />
    </View>
  );
}

function peakTop(peak: FittedPeak, windows: readonly SpectrumWindowFit[]): number {
  const window = windows.find((candidate) => peak.centre >= candidate.fromX && peak.centre <= candidate.toX);
  return (window ? baselineAt(window.baseline, peak.centre) : 0) + peak.height;
}

/** Tick labels for counts that run into the tens of thousands: 12k rather than 12000. */
function compactNumber(value: number): string {
  const size = Math.abs(value);
  if (size >= 1e6) return `${Number((value / 1e6).toPrecision(3))}M`;
  if (size >= 1e4) return `${Number((value / 1e3).toPrecision(3))}k`;
  return String(Number(value.toPrecision(3)));
}

const styles = StyleSheet.create({
  stack: { gap: space.sm },
});
