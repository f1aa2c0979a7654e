import { StyleSheet, View } from 'react-native';
import { formatLengthUm, formatNumber, type ZonePlateDesign } from '@/shared/zone-plate';
import { space } from '@/components/theme';
import { DetailRow } from '@/components/ui/detail-row';
import { Notice } from '@/components/ui/notice';
import { Heading, Text } from '@/components/ui/text';
import { FigureTable } from './figure-table';
import { chromaticRows, formatFineLength, formatPercent } from './lens-figures';

/**
 * Every figure of a design, in the order a person checks them: what gets written, how well it
 * focuses, where other colours and orders focus, how much light it can put there, and how far
 * the thin-lens radii would have been off.
 */
export function LensDesignResults({ design }: { design: ZonePlateDesign }) {
  const rim = design.thinApproximationAtRim;
  return (
    <View style={styles.stack} testID="lens-results">
      {design.warnings.map((warning) => (
        <Notice key={warning.code} tone="warn" title={WARNING_TITLES[warning.code]} testID={`lens-warning-${warning.code}`}>
          {warning.message}
        </Notice>
      ))}

      <View style={styles.facts}>
        <Figure label="Zones" value={String(design.zoneCount)} testID="lens-zone-count" />
        <Figure label="Lens diameter (2 rₙ)" value={formatLengthUm(design.lensDiameterUm)} testID="lens-diameter" />
        <Figure label="Outermost zone width Δr" value={formatFineLength(design.outermostZoneWidthUm)} testID="lens-outer-width" />
        <Figure label="Numerical aperture" value={formatNumber(design.numericalAperture)} testID="lens-na" />
        <Figure label="Resolution (1.22 Δr)" value={formatFineLength(design.resolutionUm)} testID="lens-resolution" />
        <Figure label="Depth of focus" value={`± ${formatFineLength(design.depthOfFocusPlusMinusUm)}`} testID="lens-dof" />
        <Figure label="Bandwidth Δλ/λ" value={`≤ ${formatPercent(design.maxRelativeBandwidth, 2)}`} testID="lens-bandwidth" />
        <Figure label="Etched zones" value={`${design.etchedZoneCount} (${design.etchedZones})`} testID="lens-etched-count" />
      </View>

      <View style={styles.section}>
        <Heading level={3}>Focal length at other wavelengths</Heading>
        <Text variant="caption" tone="muted">
          f ∝ 1/λ: a zone plate focuses red light closer than blue. Common laser lines; the design wavelength is highlighted.
        </Text>
        <FigureTable
          accessibilityLabel="First-order focal length at other wavelengths"
          testID="lens-chromatic"
          columns={['Wavelength', 'Focal length']}
          rows={chromaticRows(design).map((row) => ({
            key: String(row.wavelengthNm),
            cells: [`${formatNumber(row.wavelengthNm)} nm`, formatLengthUm(row.focalLengthUm)],
            emphasis: row.isDesignWavelength,
          }))}
        />
      </View>

      <View style={styles.section}>
        <Heading level={3}>Diffraction orders and ideal efficiency</Heading>
        <Text variant="caption" tone="muted">
          A binary plate also focuses at f/3, f/5… Ideal first-order efficiency is 1/π² ≈ 10.1 % for an amplitude plate and 4/π² ≈
          40.5 % for a π phase plate (Kirz 1974; Attwood). A monolayer is neither opaque nor a π step, so a real monolayer lens
          focuses far less.
        </Text>
        <FigureTable
          accessibilityLabel="Foci and ideal efficiencies of the diffraction orders"
          testID="lens-orders"
          columns={['Order', 'Focus', 'Amplitude', 'Phase']}
          rows={design.orders.map((order) => ({
            key: String(order.order),
            cells: [
              `m = ${order.order}`,
              formatLengthUm(order.focalLengthUm),
              formatPercent(order.amplitudePlateEfficiency),
              formatPercent(order.phasePlateEfficiency),
            ],
            emphasis: order.order === 1,
          }))}
        />
      </View>

      <View style={styles.section}>
        <Heading level={3}>Exact radii against the thin approximation</Heading>
        <Text testID="lens-thin-error">
          {`At the rim, √(nλf) would put the edge ${formatFineLength(rim.differenceUm)} too far in (${formatNumber(rim.relativeDifference * 100)} % of the radius, ${formatNumber(rim.differenceInZoneWidths)} of a zone width). The radii table uses the exact rₙ = √(nλf + (nλ/2)²).`}
        </Text>
        {rim.differenceInZoneWidths >= 0.5 ? (
          <Text variant="caption" tone="muted">
            Half a zone width or more is a quarter-wave error in the path to the focus: the thin radii would blur this lens.
          </Text>
        ) : null}
      </View>
    </View>
  );
}

const WARNING_TITLES: Record<ZonePlateDesign['warnings'][number]['code'], string> = {
  'zone-narrower-than-lithography': 'Finer than your lithography',
  'zone-narrower-than-wavelength': 'Zones narrower than the wavelength',
};

function Figure({ label, value, testID }: { label: string; value: string; testID: string }) {
  return (
    <View style={styles.figure}>
      <DetailRow label={label} testID={testID}>
        {value}
      </DetailRow>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.xl },
  facts: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.md, columnGap: space.lg },
  figure: { flexBasis: 130, flexGrow: 1 },
  section: { gap: space.sm },
});
