import { line } from 'd3-shape';
import { StyleSheet, View } from 'react-native';
import { Circle, G, Line, Path, Rect } from 'react-native-svg';
import { COLOUR_CHANNELS, type ColourChannel } from '@/shared/optics/contrast';
import { FLAKE_MATERIALS } from '@/shared/optics/materials';
import type { ContrastAnalysis } from '@/shared/schemas/evidence-analysis';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { DotPill, type PillLook } from '@/components/ui/badges';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { DatasetList } from './dataset-list';
import { layersWord } from './layer-words';
import { formatNumber } from './number-text';
import { CHANNEL_LABELS, channelColour } from './plot-colors';
import { PlotLegend } from './plot-legend';
import { paddedDomain, Plot } from './plot';
import { substrateWords } from './substrate-words';

const CONFIDENCE: Record<ContrastAnalysis['confidence'], { label: string; look: PillLook }> = {
  clear: { label: 'Clear match', look: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' } },
  marginal: { label: 'Marginal match', look: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' } },
  ambiguous: { label: 'Ambiguous', look: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' } },
};

/** A contrast as a percentage, the unit in the column header. */
const percent = (value: number) => (value * 100).toFixed(1);

/** Measured contrast per colour channel beside the predictions for 1…N layers, and the best match. */
export function ContrastResultCard({ analysis }: { analysis: ContrastAnalysis }) {
  const { colors } = useTheme();
  const confidence = CONFIDENCE[analysis.confidence];
  const encodingNoted = analysis.notes.some((note) => /pixel values/i.test(note));
  return (
    <Card title="Optical contrast" testID="contrast-result">
      <View style={[styles.call, { backgroundColor: colors.sunken }]}>
        <View style={styles.figure}>
          <Text variant="display" testID="contrast-best-layers">
            {String(analysis.bestLayers)}
          </Text>
          <Text variant="caption" tone="muted">
            {analysis.bestLayers === 1 ? 'layer' : 'layers'}
          </Text>
        </View>
        <View style={styles.callText}>
          <DotPill label={confidence.label} look={confidence.look} testID={`contrast-confidence-${analysis.confidence}`} />
          <Text variant="caption">
            {`Next best ${layersWord(analysis.runnerUpLayers)}, Δχ² = ${formatNumber(analysis.margin, 3)} worse (9 or more is clear).`}
          </Text>
        </View>
      </View>
      <Text testID="contrast-summary">{analysis.summary}</Text>
      {analysis.isPoorFit ? (
        <Notice tone="warn" title="The model does not fit well">
          Even the best layer count misses a channel by more than three standard deviations. Check the material, the substrate and
          the oxide thickness, and that both boxes lie on flat, clean areas.
        </Notice>
      ) : null}
      <ContrastPlot analysis={analysis} />
      <ChannelTable analysis={analysis} />
      <Text variant="caption" tone="muted">
        {[
          `${FLAKE_MATERIALS[analysis.material].displayName} on ${substrateWords(analysis.substrate)}.`,
          // The analysis's own notes usually say how pixels were read; say it here only when they do not.
          encodingNoted
            ? null
            : analysis.pixelEncoding === 'srgb'
              ? 'Pixel values were converted from sRGB to linear light.'
              : 'Pixel values were used as recorded.',
          `Flake box ${analysis.flake.pixelCount.toLocaleString()} pixels, substrate box ${analysis.substrateRegion.pixelCount.toLocaleString()} pixels.`,
        ]
          .filter(Boolean)
          .join(' ')}
      </Text>
      {analysis.notes.map((note) => (
        <Text key={note} variant="caption">
          {note}
        </Text>
      ))}
      <View style={styles.section}>
        <Text variant="label">Optical constants the prediction used</Text>
        <DatasetList datasets={analysis.datasets} testID="contrast-datasets" />
      </View>
    </Card>
  );
}

function ContrastPlot({ analysis }: { analysis: ContrastAnalysis }) {
  const theme = useTheme();
  const layers = analysis.predictions.map((prediction) => prediction.layers);
  const values = [
    0,
    ...analysis.predictions.flatMap((prediction) => COLOUR_CHANNELS.map((channel) => prediction.predicted[channel])),
    ...COLOUR_CHANNELS.flatMap((channel) => [
      analysis.measured[channel] + analysis.uncertainty[channel],
      analysis.measured[channel] - analysis.uncertainty[channel],
    ]),
  ];
  const xDomain = [Math.min(...layers) - 0.5, Math.max(...layers) + 0.5] as const;
  return (
    <View style={styles.section}>
      <Plot
        x={{ domain: xDomain, label: 'Layers', ticks: Math.min(10, layers.length), format: (value) => String(value) }}
        y={{ domain: paddedDomain(values), label: 'Contrast (%)', format: (value) => String(Math.round(value * 100)) }}
        accessibilityLabel={`Measured contrast in red, green and blue against the predictions for ${xDomain[0] + 0.5} to ${xDomain[1] - 0.5} layers; best match ${layersWord(analysis.bestLayers)}`}
        testID="contrast-plot"
      >
        {({ x, y, innerWidth, innerHeight }) => (
          <>
            <Rect
              x={x(analysis.bestLayers - 0.4)}
              width={x(0.8) - x(0)}
              y={0}
              height={innerHeight}
              fill={theme.colors.primarySoft}
            />
            <Line x1={0} x2={innerWidth} y1={y(0)} y2={y(0)} stroke={theme.colors.outline} strokeWidth={1} />
            {COLOUR_CHANNELS.map((channel) => (
              <ChannelLines key={channel} channel={channel} analysis={analysis} x={x} y={y} innerWidth={innerWidth} />
            ))}
          </>
        )}
      </Plot>
      <PlotLegend
        entries={[
          ...COLOUR_CHANNELS.map((channel) => ({
            label: `${CHANNEL_LABELS[channel]} predicted`,
            colour: channelColour(theme, channel),
          })),
          { label: 'Measured ± σ (dashed, shaded)', colour: theme.colors.inkMuted, dashed: true },
        ]}
      />
    </View>
  );
}

interface ChannelLinesProps {
  channel: ColourChannel;
  analysis: ContrastAnalysis;
  x: (value: number) => number;
  y: (value: number) => number;
  innerWidth: number;
}

function ChannelLines({ channel, analysis, x, y, innerWidth }: ChannelLinesProps) {
  const theme = useTheme();
  const colour = channelColour(theme, channel);
  const measured = analysis.measured[channel];
  const sigma = analysis.uncertainty[channel];
  const path = line<ContrastAnalysis['predictions'][number]>()
    .x((prediction) => x(prediction.layers))
    .y((prediction) => y(prediction.predicted[channel]))(analysis.predictions);
  return (
    <G>
      <Rect
        x={0}
        width={innerWidth}
        y={y(measured + sigma)}
        height={Math.abs(y(measured - sigma) - y(measured + sigma))}
        fill={colour}
        opacity={0.12}
      />
      <Line x1={0} x2={innerWidth} y1={y(measured)} y2={y(measured)} stroke={colour} strokeWidth={1.5} strokeDasharray="6 4" />
      <Path d={path ?? ''} stroke={colour} strokeWidth={2} fill="none" />
      {analysis.predictions.map((prediction) => (
        <Circle key={prediction.layers} cx={x(prediction.layers)} cy={y(prediction.predicted[channel])} r={3.5} fill={colour} />
      ))}
    </G>
  );
}

function ChannelTable({ analysis }: { analysis: ContrastAnalysis }) {
  const theme = useTheme();
  const best = analysis.predictions.find((prediction) => prediction.layers === analysis.bestLayers);
  const runnerUp = analysis.predictions.find((prediction) => prediction.layers === analysis.runnerUpLayers);
  return (
    <View style={[styles.table, { borderColor: theme.colors.hairline }]} testID="contrast-table" accessibilityRole="summary">
      <View style={styles.tableRow}>
        <Text variant="caption" tone="muted" style={styles.cell}>
          Channel
        </Text>
        <Text variant="caption" tone="muted" style={styles.cell}>
          Measured (%)
        </Text>
        <Text variant="caption" tone="muted" style={styles.cell}>
          {`${layersWord(analysis.bestLayers)} (%)`}
        </Text>
        <Text variant="caption" tone="muted" style={styles.cell}>
          {`${layersWord(analysis.runnerUpLayers)} (%)`}
        </Text>
      </View>
      {COLOUR_CHANNELS.map((channel) => (
        <View key={channel} style={[styles.tableRow, { borderTopColor: theme.colors.hairline }, styles.ruled]}>
          <View style={[styles.cell, styles.channel]}>
            <View style={[styles.swatch, { backgroundColor: channelColour(theme, channel) }]} />
            <Text variant="label">{CHANNEL_LABELS[channel]}</Text>
          </View>
          <View style={styles.cell} testID={`contrast-measured-${channel}`}>
            <Text>{percent(analysis.measured[channel])}</Text>
            <Text variant="caption" tone="muted">{`± ${percent(analysis.uncertainty[channel])}`}</Text>
          </View>
          <Text style={styles.cell}>{best ? percent(best.predicted[channel]) : '–'}</Text>
          <Text style={styles.cell}>{runnerUp ? percent(runnerUp.predicted[channel]) : '–'}</Text>
        </View>
      ))}
    </View>
  );
}

const SWATCH = space.md;

const styles = StyleSheet.create({
  call: { flexDirection: 'row', alignItems: 'center', gap: space.lg, padding: space.lg, borderRadius: radii.md },
  figure: { alignItems: 'center', minWidth: sizes.touchTarget + space.lg },
  callText: { flex: 1, gap: space.sm },
  section: { gap: space.sm },
  table: { borderWidth: sizes.hairline, borderRadius: radii.md, paddingHorizontal: space.md },
  tableRow: { flexDirection: 'row', alignItems: 'center', minHeight: sizes.touchTarget - space.sm, gap: space.sm },
  ruled: { borderTopWidth: sizes.hairline },
  cell: { flex: 1 },
  channel: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: SWATCH, height: SWATCH, borderRadius: SWATCH / 2 },
});
