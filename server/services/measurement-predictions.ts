import type { MeasurementKind, MeasurementPrediction, MeasurementRow } from '../../shared/schemas/device';
import type { ZonePlateDesignSummary } from '../../shared/schemas/zone-plate';
import { focalLengthAtWavelengthUm, formatLengthUm, formatNumber } from '../../shared/zone-plate';

/** Points of the predicted f(λ) curve drawn between the measured wavelengths. */
const CURVE_POINTS = 41;

/**
 * What the design predicts beside a measurement. Focal length against wavelength follows
 * f(λ) = f₀λ₀/λ (paraxial; Attwood, Soft X-Rays and EUV Radiation, ch. 9); against gate voltage
 * the design has one focal length and the ideal binary-plate efficiencies (1/π² amplitude,
 * 4/π² phase, same source) as reference levels: the gate-tuning itself is not modelled.
 */
export function predictionFor(
  kind: MeasurementKind,
  rows: readonly MeasurementRow[],
  design: ZonePlateDesignSummary | null,
): MeasurementPrediction | null {
  if (!design) return null;
  const lens = { wavelengthNm: design.wavelengthNm, focalLengthUm: design.focalLengthUm };
  const designed = `${formatLengthUm(design.focalLengthUm)} at ${formatNumber(design.wavelengthNm)} nm`;
  if (kind === 'focal_length_vs_wavelength') {
    const xs = rows.map((row) => row.x).filter((x) => x > 0);
    const low = Math.min(...xs, design.wavelengthNm);
    const high = Math.max(...xs, design.wavelengthNm);
    const span = high - low;
    const curve = Array.from({ length: span > 0 ? CURVE_POINTS : 1 }, (_, index) => {
      const x = span > 0 ? low + (span * index) / (CURVE_POINTS - 1) : low;
      return { x, y: focalLengthAtWavelengthUm(lens, x) };
    });
    return {
      basis: `f = f₀·λ₀/λ from the design (${designed}); paraxial, first order.`,
      curve,
      levels: [],
    };
  }
  if (kind === 'focal_length_vs_gate_voltage') {
    return {
      basis: `The design's focal length (${designed}); the design does not model gate tuning.`,
      curve: [],
      levels: [{ label: 'Design focal length', y: design.focalLengthUm }],
    };
  }
  const percent = (fraction: number) => fraction * 100;
  return {
    basis: 'Ideal first-order efficiencies of a binary zone plate: amplitude 1/π², phase 4/π².',
    curve: [],
    levels: [
      { label: 'Ideal amplitude plate', y: percent(design.idealFirstOrderEfficiency.amplitudePlate) },
      { label: 'Ideal phase plate', y: percent(design.idealFirstOrderEfficiency.phasePlate) },
    ],
  };
}
