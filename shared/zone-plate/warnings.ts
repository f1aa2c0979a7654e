/**
 * Warnings a design can carry: it is computable, but the lab should look twice before writing it.
 */
import { formatLengthUm, formatNumber, plural } from './format';
import { apertureDiameterForZoneCountUm, largestZoneCountForMinFeature, type ZonePlateLens } from './optics';

export const ZONE_PLATE_WARNING_CODES = ['zone-narrower-than-lithography', 'zone-narrower-than-wavelength'] as const;
export type ZonePlateWarningCode = (typeof ZONE_PLATE_WARNING_CODES)[number];

export interface ZonePlateWarning {
  code: ZonePlateWarningCode;
  message: string;
}

/**
 * The outermost zone is the finest line to write (zones narrow outwards). Says how many zones
 * would stay writable; longer focal lengths widen every zone (Δr ≈ λf/(2r_N), Attwood ch. 9).
 */
export function lithographyWarning(
  lens: ZonePlateLens,
  zoneCount: number,
  outermostZoneWidthUm: number,
  minFeatureNm: number,
): ZonePlateWarning | null {
  const widthNm = outermostZoneWidthUm * 1000;
  if (widthNm >= minFeatureNm) return null;
  const writable = largestZoneCountForMinFeature(lens, minFeatureNm / 1000, zoneCount);
  const advice =
    writable >= 1
      ? ` Up to ${plural(writable, 'zone', 'zones')} (a ${formatLengthUm(apertureDiameterForZoneCountUm(lens, writable))} aperture) stay at or above ${formatNumber(minFeatureNm)} nm; a longer focal length widens every zone.`
      : ' Even the central zone is narrower; use a longer focal length.';
  return {
    code: 'zone-narrower-than-lithography',
    message: `The outermost zone is ${formatNumber(widthNm)} nm wide; your lithography writes ${formatNumber(minFeatureNm)} nm.${advice}`,
  };
}

/**
 * Zones narrower than the wavelength (NA above 0.5) are where scalar diffraction theory — the
 * basis of the resolution, depth of focus and efficiencies here — stops being trustworthy and a
 * vector (e.g. FDTD) simulation is needed (common practice, no source).
 */
export function subwavelengthWarning(wavelengthNm: number, outermostZoneWidthUm: number): ZonePlateWarning | null {
  const widthNm = outermostZoneWidthUm * 1000;
  if (widthNm >= wavelengthNm) return null;
  return {
    code: 'zone-narrower-than-wavelength',
    message: `The outermost zone (${formatNumber(widthNm)} nm) is narrower than the wavelength (${formatNumber(wavelengthNm)} nm): the resolution, depth of focus and efficiencies shown come from scalar theory and are unreliable there; check the design with a vector (FDTD) simulation.`,
  };
}
