import { line } from 'd3-shape';
import { StyleSheet, View } from 'react-native';
import { G, Line, Path, Text as SvgText } from 'react-native-svg';
import { FLAKE_MATERIALS } from '@/shared/optics/materials';
import type { Evidence } from '@/shared/schemas/evidence';
import type { AfmAnalysis } from '@/shared/schemas/evidence-analysis';
import { fontFaces, space, typeScale, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { useEvidencePointsQuery } from '@/hooks/use-evidence';
import { DataTable, withError } from './data-table';
import { EstimateCard } from './estimate-card';
import { formatNumber } from './number-text';
import { PlotLegend } from './plot-legend';
import { paddedDomain, Plot } from './plot';
import { levelledProfile } from './afm-profile';
import { thinForDrawing } from './plot-thinning';

type Afm = Extract<Evidence, { kind: 'afm' }>;

const LABEL_FONT = typeScale.caption.fontSize ?? 14;

/** An AFM line profile with its fitted levels and steps, and the layer count they give. */
export function AfmEvidence({ evidence }: { evidence: Afm }) {
  const points = useEvidencePointsQuery(evidence.file);
  const analysis = evidence.analysis.afm;
  let plot;
  if (points.data?.ok === true && analysis) {
    plot = <ProfilePlot profile={levelledProfile(points.data.x, points.data.y, analysis)} analysis={analysis} />;
  } else if (points.data?.ok === false) {
    plot = (
      <Notice tone="error" title="The stored file could not be read again">
        {points.data.message}
      </Notice>
    );
  } else if (points.isError) {
    plot = (
      <ErrorState
        title="Could not load the profile"
        error={points.error}
        onRetry={() => void points.refetch()}
        retrying={points.isFetching}
      />
    );
  } else if (analysis) {
    plot = <LoadingState label="Loading the profile…" />;
  }

  return (
    <>
      <Card
        title="AFM line profile"
        lead={
          analysis
            ? `${FLAKE_MATERIALS[analysis.material].displayName}, ${formatNumber(analysis.interlayerSpacingNm)} nm per layer`
            : undefined
        }
        testID="afm-card"
      >
        {analysis ? null : (
          <Notice tone="warn" title="Not analysed">
            {evidence.analysis.notes?.join(' ') || 'Flakeline could not find flat levels in this profile.'}
          </Notice>
        )}
        {plot}
        {analysis ? (
          <>
            <DataTable
              headers={['Step', 'Height (nm)', 'Kind', 'Layers']}
              rows={analysis.steps.map((step) => [
                `${step.fromLevel} → ${step.toLevel}`,
                withError(step.heightNm, step.stdErrNm, 2),
                step.kind === 'substrate' ? 'Onto the flake' : 'Layer to layer',
                String(step.layers),
              ])}
              testID="afm-steps"
            />
            <Text variant="caption" tone="muted">
              {`Tilt removed: ${formatNumber(analysis.slopeNmPerUm)} nm/µm. Noise ${formatNumber(analysis.noiseNm)} nm. The step onto the flake includes an offset of ${formatNumber(analysis.offsetNm)} ± ${formatNumber(analysis.offsetUncertaintyNm)} nm for adsorbates and tip settings; steps between layers do not.`}
            </Text>
          </>
        ) : null}
      </Card>
      {analysis ? <EstimateCard estimate={analysis.estimate} references={analysis.references} notes={analysis.notes} /> : null}
    </>
  );
}

function ProfilePlot({ profile, analysis }: { profile: { x: number; y: number }[]; analysis: AfmAnalysis }) {
  const { colors } = useTheme();
  const xDomain: [number, number] = [profile[0]?.x ?? 0, profile[profile.length - 1]?.x ?? 1];
  const [low, high] = paddedDomain([...profile.map((point) => point.y), ...analysis.levels.map((level) => level.heightNm)], 0.1);
  // Headroom above the top level for its label.
  const yDomain: [number, number] = [low, high + (high - low) * 0.12];
  return (
    <View style={styles.stack}>
      <Plot
        x={{ domain: xDomain, label: 'Position (µm)' }}
        y={{ domain: yDomain, label: 'Height (nm)' }}
        accessibilityLabel={`AFM profile with ${analysis.levels.length} fitted levels; the steps are in the table below.`}
        testID="afm-plot"
      >
        {({ x, y, innerWidth }) => (
          <>
            <Path
              d={
                line<{ x: number; y: number }>()
                  .x((point) => x(point.x))
                  .y((point) => y(point.y))(thinForDrawing(profile, innerWidth)) ?? ''
              }
              stroke={colors.inkMuted}
              strokeWidth={1}
              fill="none"
            />
            {analysis.levels.map((level, i) => (
              <G key={`${level.fromUm}-${level.toUm}`}>
                <Line
                  x1={x(level.fromUm)}
                  x2={x(level.toUm)}
                  y1={y(level.heightNm)}
                  y2={y(level.heightNm)}
                  stroke={colors.primary}
                  strokeWidth={3}
                />
                <SvgText
                  x={(x(level.fromUm) + x(level.toUm)) / 2}
                  y={y(level.heightNm) - space.sm}
                  fill={colors.ink}
                  fontSize={LABEL_FONT}
                  fontFamily={fontFaces.sansMedium}
                  textAnchor="middle"
                >
                  {i === 0 ? 'substrate' : `${level.layers} L`}
                </SvgText>
              </G>
            ))}
          </>
        )}
      </Plot>
      <PlotLegend
        entries={[
          { label: 'Profile, tilt removed', colour: colors.inkMuted },
          { label: 'Fitted level', colour: colors.primary },
        ]}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.sm },
});
