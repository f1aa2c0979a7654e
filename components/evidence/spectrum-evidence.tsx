import { useState } from 'react';
import type { Evidence } from '@/shared/schemas/evidence';
import type {
  DerivedQuantity,
  FittedPeak,
  PlAnalysis,
  RamanAnalysis,
  SpectrumWindowFit,
} from '@/shared/schemas/evidence-analysis';
import { FLAKE_MATERIALS } from '@/shared/optics/materials';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { Notice } from '@/components/ui/notice';
import { ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { useEvidencePointsQuery } from '@/hooks/use-evidence';
import { DataTable as Table, withError } from './data-table';
import { EstimateCard } from './estimate-card';
import { formatNumber } from './number-text';
import { plotPointsOfPl } from './pl-axis';
import { SpectrumPlot } from './spectrum-plot';

type Spectrum = Extract<Evidence, { kind: 'raman' | 'pl' }>;
/** 'whole', or the index of a fitted window as text. */
type Range = string;
const WHOLE = 'whole';

/** A window named after the modes fitted in it ("E¹2g, A1g"), or by its span. */
function windowLabel(window: SpectrumWindowFit, peaks: readonly FittedPeak[]): string {
  const named = peaks
    .filter((peak) => peak.label && peak.centre >= window.fromX && peak.centre <= window.toX)
    .map((peak) => peak.label);
  return named.length ? named.join(', ') : `${formatNumber(window.fromX, 4)}–${formatNumber(window.toX, 4)}`;
}

/** One fitted window with a little margin, or the whole file. */
function rangeOf(choice: Range, x: readonly number[], windows: readonly SpectrumWindowFit[]): [number, number] {
  const whole: [number, number] = [x[0], x[x.length - 1]];
  const window = choice === WHOLE ? undefined : windows[Number(choice)];
  if (!window) return whole;
  const margin = (window.toX - window.fromX) * 0.05;
  return [Math.max(whole[0], window.fromX - margin), Math.min(whole[1], window.toX + margin)];
}

/** A Raman or PL spectrum: the plot with its fitted peaks, the peaks in numbers, and the layer call. */
export function SpectrumEvidence({ evidence }: { evidence: Spectrum }) {
  const points = useEvidencePointsQuery(evidence.file);
  // The material's own modes first: the rule's window comes first, the silicon line after it.
  const [range, setRange] = useState<Range>('0');
  const analysis = evidence.kind === 'raman' ? evidence.analysis.raman : evidence.analysis.pl;
  const title = evidence.kind === 'raman' ? 'Raman spectrum' : 'Photoluminescence spectrum';

  let plot;
  if (points.data?.ok === true && analysis) {
    const data =
      evidence.kind === 'pl' && evidence.analysis.pl
        ? plotPointsOfPl(points.data.x, points.data.y, evidence.analysis.pl.xUnit)
        : points.data;
    const shown = rangeOf(range, data.x, analysis.windows);
    plot = (
      <>
        {analysis.windows.length > 1 || evidence.kind === 'raman' ? (
          <ChoiceChips
            label="Show"
            choices={[
              ...analysis.windows.map((window, i) => ({ value: String(i), label: windowLabel(window, analysis.peaks) })),
              { value: WHOLE, label: 'Whole spectrum' },
            ]}
            value={range}
            onChange={setRange}
            testID="spectrum-range"
          />
        ) : null}
        <SpectrumPlot
          x={data.x}
          y={data.y}
          windows={analysis.windows}
          peaks={analysis.peaks}
          range={shown}
          xLabel={evidence.kind === 'raman' ? 'Raman shift (cm⁻¹)' : 'Photon energy (eV)'}
          accessibilityLabel={`${title} with ${analysis.peaks.length} fitted peaks; the numbers are in the table below.`}
          testID="spectrum-plot"
        />
      </>
    );
  } else if (points.data?.ok === false) {
    plot = (
      <Notice tone="error" title="The stored file could not be read again">
        {points.data.message}
      </Notice>
    );
  } else if (points.isError) {
    plot = (
      <ErrorState
        title="Could not load the spectrum"
        error={points.error}
        onRetry={() => void points.refetch()}
        retrying={points.isFetching}
      />
    );
  } else if (analysis) {
    plot = <LoadingState label="Loading the spectrum…" />;
  }

  return (
    <>
      <Card
        title={title}
        lead={
          analysis
            ? `${FLAKE_MATERIALS[analysis.material].displayName}${evidence.metadata.laserNm ? `, ${evidence.metadata.laserNm} nm laser` : ''}`
            : undefined
        }
        testID="spectrum-card"
      >
        {analysis ? null : (
          <Notice tone="warn" title="Not analysed">
            {evidence.analysis.notes?.join(' ') ||
              'Flakeline could not analyse this spectrum. Check the material and the laser line.'}
          </Notice>
        )}
        {plot}
        {analysis ? (
          evidence.kind === 'pl' && evidence.analysis.pl ? (
            <PlPeaksTable analysis={evidence.analysis.pl} />
          ) : (
            <PeaksTable peaks={analysis.peaks} unit="cm⁻¹" />
          )
        ) : null}
        {analysis?.windows.map((window) => (
          <Text key={window.fromX} variant="caption" tone="muted">
            {`Fit over ${formatNumber(window.fromX, 4)}–${formatNumber(window.toX, 4)}: residual ${formatNumber(window.rmsResidual)} against noise ${formatNumber(window.noise)}${window.converged ? '' : ' (the fit did not fully converge)'}.`}
          </Text>
        ))}
      </Card>
      {evidence.kind === 'raman' && evidence.analysis.raman ? (
        <QuantitiesCard quantities={evidence.analysis.raman.quantities} />
      ) : null}
      {evidence.kind === 'pl' && evidence.analysis.pl ? <PlComparisonCard analysis={evidence.analysis.pl} /> : null}
      {analysis ? <EstimateCard estimate={analysis.estimate} references={analysis.references} notes={analysis.notes} /> : null}
    </>
  );
}

function PeaksTable({ peaks, unit }: { peaks: readonly FittedPeak[]; unit: string }) {
  if (peaks.length === 0) return <Text tone="muted">No peaks were found above the noise.</Text>;
  return (
    <Table
      headers={['Peak', `Position (${unit})`, `FWHM (${unit})`, 'Height']}
      rows={peaks.map((peak) => [
        peak.label ?? '–',
        withError(peak.centre, peak.stdErr?.centre, 1),
        withError(peak.fwhm, peak.stdErr?.fwhm, 1),
        formatNumber(peak.height),
      ])}
      columnFlex={[0.9, 1.2, 1, 0.9]}
      testID="peaks-table"
    />
  );
}

function PlPeaksTable({ analysis }: { analysis: PlAnalysis }) {
  if (analysis.peaks.length === 0) return <Text tone="muted">No peaks were found above the noise.</Text>;
  return (
    <Table
      headers={['Peak', 'Energy (eV)', 'FWHM (meV)', 'Height']}
      rows={analysis.peaks.map((peak) => [
        peak.label ?? '–',
        { value: peak.energyEv.toFixed(3), detail: `${peak.wavelengthNm.toFixed(1)} nm` },
        withError(peak.fwhm * 1000, peak.stdErr ? peak.stdErr.fwhm * 1000 : undefined, 0),
        formatNumber(peak.height),
      ])}
      columnFlex={[1.3, 1.1, 1, 0.8]}
      testID="peaks-table"
    />
  );
}

function QuantitiesCard({ quantities }: { quantities: readonly DerivedQuantity[] }) {
  if (quantities.length === 0) return null;
  return (
    <Card title="Derived from the peaks" testID="spectrum-quantities">
      <Table
        headers={['Quantity', 'Value']}
        rows={quantities.map((quantity) => {
          const cell = withError(quantity.value, quantity.stdErr, 2);
          return [
            quantity.label,
            typeof cell === 'string'
              ? `${cell} ${quantity.unit}`.trim()
              : { value: `${cell.value} ${quantity.unit}`.trim(), detail: cell.detail },
          ];
        })}
        testID="quantities-table"
      />
    </Card>
  );
}

function PlComparisonCard({ analysis }: { analysis: PlAnalysis }) {
  const rows: string[][] = [];
  if (analysis.aExciton)
    rows.push(['A exciton', `${analysis.aExciton.energyEv.toFixed(3)} eV (${analysis.aExciton.wavelengthNm.toFixed(1)} nm)`]);
  if (analysis.monolayerAExcitonEv !== null) {
    rows.push([
      'Monolayer A exciton',
      `${analysis.monolayerAExcitonEv.toFixed(3)} eV${analysis.toleranceEv !== null ? ` ± ${(analysis.toleranceEv * 1000).toFixed(0)} meV accepted` : ''}`,
    ]);
  }
  // Rounded first, so a shift of −0.3 meV reads "0 meV", not "−0 meV".
  if (analysis.shiftMeV !== null) rows.push(['Shift from the monolayer value', `${Math.round(analysis.shiftMeV) || 0} meV`]);
  if (analysis.relativeIntensity !== null)
    rows.push(['Intensity relative to the reference', `${formatNumber(analysis.relativeIntensity)} ×`]);
  if (rows.length === 0) return null;
  return (
    <Card title="Against the monolayer" testID="pl-comparison">
      <Table headers={['', '']} rows={rows} columnFlex={[1, 1.2]} testID="pl-comparison-table" />
    </Card>
  );
}
