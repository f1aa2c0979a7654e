import { focalLengthAtWavelengthUm, formatLengthUm, formatNumber, type ZonePlateDesign } from '@/shared/zone-plate';

/**
 * Laser lines found on many optical benches: diode 405 nm, frequency-doubled Nd:YAG 532 nm,
 * helium–neon 632.8 nm, Raman diode 785 nm, Nd:YAG 1064 nm (wavelengths from memory; the choice
 * of lines is common practice, no source).
 */
export const LAB_LINES_NM = [405, 532, 632.8, 785, 1064] as const;

/** Widths below a micrometre read better in nanometres (outermost zones usually are). */
export function formatFineLength(valueUm: number): string {
  return Math.abs(valueUm) < 1 ? `${formatNumber(valueUm * 1000)} nm` : formatLengthUm(valueUm);
}

export function formatPercent(fraction: number, decimals = 1): string {
  return `${(fraction * 100).toFixed(decimals)} %`;
}

export interface ChromaticRow {
  wavelengthNm: number;
  focalLengthUm: number;
  isDesignWavelength: boolean;
}

/** A lab line this close to the design wavelength would only repeat the design's own row. */
const SAME_LINE_NM = 1;

/**
 * First-order focal length at each lab line and at the design wavelength, shortest wavelength
 * first: f(λ′) = f·λ/λ′ (Attwood, zone-plate chromatic dispersion; see shared/zone-plate/optics).
 */
export function chromaticRows(design: Pick<ZonePlateDesign, 'wavelengthNm' | 'focalLengthUm'>): ChromaticRow[] {
  const lens = { wavelengthNm: design.wavelengthNm, focalLengthUm: design.focalLengthUm };
  const others = LAB_LINES_NM.filter((line) => Math.abs(line - design.wavelengthNm) >= SAME_LINE_NM);
  const wavelengths = [...others, design.wavelengthNm].sort((a, b) => a - b);
  return wavelengths.map((wavelengthNm) => ({
    wavelengthNm,
    focalLengthUm: focalLengthAtWavelengthUm(lens, wavelengthNm),
    isDesignWavelength: wavelengthNm === design.wavelengthNm,
  }));
}
