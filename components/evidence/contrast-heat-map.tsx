import { scaleLinear } from 'd3-scale';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, Defs, G, Line, LinearGradient, Rect, Stop } from 'react-native-svg';
import type { ContrastMap } from '@/shared/optics/planning';
import { space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';
import { contrastScaleColours } from './plot-colors';
import { Plot } from './plot';
import { useLayoutWidth } from './use-layout-width';

export interface HeatMapMark {
  oxideThicknessNm: number;
  /** A point at this wavelength; without it, a line across the whole oxide row. */
  wavelengthNm?: number;
  label: string;
}

export interface ContrastHeatMapProps {
  map: ContrastMap;
  marks: readonly HeatMapMark[];
}

function colourScale(map: ContrastMap, colours: ReturnType<typeof contrastScaleColours>) {
  // Symmetric about zero so "no contrast" is always the neutral middle colour.
  const extreme = Math.max(Math.abs(map.darkest.contrast), Math.abs(map.brightest.contrast), 1e-6);
  const scale = scaleLinear<string>()
    .domain([-extreme, 0, extreme])
    .range([colours.brighter, colours.vanishing, colours.darker])
    .clamp(true);
  return { scale, extreme };
}

/**
 * Predicted contrast over oxide thickness (up) and wavelength (across). Each oxide row is one
 * rectangle with a gradient through its wavelengths: a few dozen shapes instead of thousands
 * of cells, cheap enough to redraw on a phone.
 */
export function ContrastHeatMap({ map, marks }: ContrastHeatMapProps) {
  const theme = useTheme();
  const colours = contrastScaleColours(theme);
  const { scale, extreme } = colourScale(map, colours);
  const oxides = map.oxideThicknessesNm;
  const wavelengths = map.wavelengthsNm;
  const oxideStep = oxides.length > 1 ? oxides[1] - oxides[0] : 1;
  const xDomain = [wavelengths[0], wavelengths[wavelengths.length - 1]] as const;
  const yDomain = [oxides[0] - oxideStep / 2, oxides[oxides.length - 1] + oxideStep / 2] as const;

  return (
    <View style={styles.stack}>
      <Plot
        x={{ domain: xDomain, label: 'Wavelength (nm)' }}
        y={{ domain: yDomain, label: 'Oxide thickness (nm)', ticks: 8 }}
        aspect={0.9}
        accessibilityLabel={`Heat map of predicted monolayer contrast against oxide thickness 0 to 400 nm and wavelength ${xDomain[0]} to ${xDomain[1]} nm`}
        testID="planning-heat-map"
      >
        {({ x, y, innerWidth }) => {
          const rowHeight = Math.abs(y(oxideStep) - y(0)) + 0.5;
          return (
            <G>
              <Defs>
                {oxides.map((oxide, i) => (
                  <LinearGradient key={oxide} id={`oxide-row-${i}`} x1="0" y1="0" x2="1" y2="0">
                    {wavelengths.map((wavelength, j) => (
                      <Stop
                        key={wavelength}
                        offset={(wavelength - xDomain[0]) / (xDomain[1] - xDomain[0])}
                        stopColor={scale(map.contrast[i][j])}
                      />
                    ))}
                  </LinearGradient>
                ))}
              </Defs>
              {oxides.map((oxide, i) => (
                <Rect
                  key={oxide}
                  x={0}
                  y={y(oxide) - rowHeight / 2}
                  width={innerWidth}
                  height={rowHeight}
                  fill={`url(#oxide-row-${i})`}
                />
              ))}
              {marks.map((mark) =>
                mark.wavelengthNm === undefined ? (
                  <Line
                    key={mark.label}
                    x1={0}
                    x2={innerWidth}
                    y1={y(mark.oxideThicknessNm)}
                    y2={y(mark.oxideThicknessNm)}
                    stroke={theme.colors.ink}
                    strokeWidth={2}
                    strokeDasharray="6 4"
                  />
                ) : (
                  <Circle
                    key={mark.label}
                    cx={x(mark.wavelengthNm)}
                    cy={y(mark.oxideThicknessNm)}
                    r={space.sm}
                    fill="none"
                    stroke={theme.colors.ink}
                    strokeWidth={2}
                  />
                ),
              )}
            </G>
          );
        }}
      </Plot>
      <ColourBar extreme={extreme} colours={colours} />
    </View>
  );
}

function ColourBar({ extreme, colours }: { extreme: number; colours: ReturnType<typeof contrastScaleColours> }) {
  const { colors } = useTheme();
  const { width, onLayout } = useLayoutWidth();
  const percent = (extreme * 100).toFixed(1);
  return (
    <View style={styles.bar} accessibilityLabel={`Colour scale from ${percent} % brighter to ${percent} % darker`}>
      <View onLayout={onLayout} style={styles.barTrack}>
        {width > 0 ? (
          <Svg width={width} height={BAR_HEIGHT}>
            <Defs>
              <LinearGradient id="contrast-bar" x1="0" y1="0" x2="1" y2="0">
                <Stop offset={0} stopColor={colours.brighter} />
                <Stop offset={0.5} stopColor={colours.vanishing} />
                <Stop offset={1} stopColor={colours.darker} />
              </LinearGradient>
            </Defs>
            <Rect
              x={0}
              y={0}
              width={width}
              height={BAR_HEIGHT}
              fill="url(#contrast-bar)"
              stroke={colors.outline}
              strokeWidth={1}
            />
          </Svg>
        ) : null}
      </View>
      <View style={styles.barLabels}>
        <Text variant="caption">{`Flake ${percent} % brighter`}</Text>
        <Text variant="caption">Invisible</Text>
        <Text variant="caption">{`${percent} % darker`}</Text>
      </View>
    </View>
  );
}

const BAR_HEIGHT = space.lg;

const styles = StyleSheet.create({
  stack: { gap: space.md },
  bar: { gap: space.xs },
  barTrack: { height: BAR_HEIGHT, alignSelf: 'stretch' },
  barLabels: { flexDirection: 'row', justifyContent: 'space-between' },
});
