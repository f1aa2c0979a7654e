/**
 * A whole zone-plate design from the lab's inputs: zone count, radii table, the figures of merit
 * (NA, resolution, depth of focus, bandwidth, higher orders, ideal efficiencies), warnings, and a
 * compact summary to store with the device. Validate input with `ZonePlateDesignInput`
 * (shared/schemas/zone-plate.ts) first; called directly with bad input this throws a RangeError
 * carrying the schema's messages.
 */
import type { ZonePlateDesignSummary } from '../schemas/zone-plate';
import { DEFAULT_ETCHED_ZONES, DEFAULT_MIN_FEATURE_NM, type EtchedZones } from './limits';
import {
  AMPLITUDE_PLATE_FIRST_ORDER_EFFICIENCY,
  PHASE_PLATE_FIRST_ORDER_EFFICIENCY,
  depthOfFocusPlusMinusUm,
  diffractionOrders,
  maxRelativeBandwidth,
  numericalAperture,
  paraxialOutermostZoneWidthUm,
  rayleighResolutionUm,
  smallAngleNumericalAperture,
  zoneCountForAperture,
  zoneRadii,
  type DiffractionOrder,
  type ZonePlateLens,
  type ZoneRadius,
} from './optics';
import { fieldProblems, geometryProblems } from './validation';
import { lithographyWarning, subwavelengthWarning, type ZonePlateWarning } from './warnings';

export interface ZonePlateDesignParams {
  wavelengthNm: number;
  focalLengthUm: number;
  apertureDiameterUm?: number;
  zoneCount?: number;
  minFeatureNm?: number;
  etchedZones?: EtchedZones;
}

/**
 * Orders listed in a design: 1, 3 and 5 — by the fifth a binary plate sends 1/25 of the
 * first-order light (1/(m²π²), Kirz 1974, from memory), too little to matter for a lab's lens.
 */
export const LISTED_MAX_ORDER = 5;

export interface ZonePlateDesign {
  wavelengthNm: number;
  focalLengthUm: number;
  /** The aperture given, or null when only a zone count was given. */
  apertureDiameterUm: number | null;
  /** N: the zone count given, else the most zones the aperture holds (2 r_N ≤ D). */
  zoneCount: number;
  /** 2 r_N. */
  lensDiameterUm: number;
  minFeatureNm: number;
  etchedZones: EtchedZones;
  /** Δr = r_N − r_{N−1}, exact radii. */
  outermostZoneWidthUm: number;
  /** λf/(2 r_N), Attwood's many-zone estimate of Δr, for comparison. */
  paraxialOutermostZoneWidthUm: number;
  /** sin(atan(r_N/f)). */
  numericalAperture: number;
  /** λ/(2Δr). */
  smallAngleNumericalAperture: number;
  /** First-order Rayleigh resolution 1.22 Δr. */
  resolutionUm: number;
  /** ±2(Δr)²/λ about the focus. */
  depthOfFocusPlusMinusUm: number;
  /** Δλ/λ ≤ 1/N. */
  maxRelativeBandwidth: number;
  idealFirstOrderEfficiency: { amplitudePlate: number; phasePlate: number };
  /** Odd orders 1…LISTED_MAX_ORDER. */
  orders: DiffractionOrder[];
  /** Zones 1…N with exact and thin radii. */
  zones: ZoneRadius[];
  /**
   * The thin approximation's error at the outermost edge. Every measure of it grows outwards
   * (≈ nλ/(8f) relative, ≈ n²λ/(4f) zone widths), so the rim is the worst zone.
   */
  thinApproximationAtRim: { differenceUm: number; relativeDifference: number; differenceInZoneWidths: number };
  /** How many of the N zones are etched. */
  etchedZoneCount: number;
  warnings: ZonePlateWarning[];
}

export function designZonePlate(params: ZonePlateDesignParams): ZonePlateDesign {
  const problems = [...fieldProblems(params), ...geometryProblems(params)];
  if (problems.length > 0) {
    throw new RangeError(problems.map((problem) => `${problem.path}: ${problem.message}`).join(' '));
  }
  const lens: ZonePlateLens = { wavelengthNm: params.wavelengthNm, focalLengthUm: params.focalLengthUm };
  const minFeatureNm = params.minFeatureNm ?? DEFAULT_MIN_FEATURE_NM;
  const etchedZones = params.etchedZones ?? DEFAULT_ETCHED_ZONES;
  // geometryProblems guarantees one of the two is there and that the aperture holds a zone.
  const zoneCount = params.zoneCount ?? zoneCountForAperture(lens, params.apertureDiameterUm ?? 0);

  const zones = zoneRadii(lens, zoneCount);
  const rim = zones[zones.length - 1];
  const outermostZoneWidthUm = rim.widthUm;
  const warnings = [
    lithographyWarning(lens, zoneCount, outermostZoneWidthUm, minFeatureNm),
    subwavelengthWarning(lens.wavelengthNm, outermostZoneWidthUm),
  ].filter((warning): warning is ZonePlateWarning => warning !== null);

  return {
    wavelengthNm: lens.wavelengthNm,
    focalLengthUm: lens.focalLengthUm,
    apertureDiameterUm: params.apertureDiameterUm ?? null,
    zoneCount,
    lensDiameterUm: 2 * rim.outerRadiusUm,
    minFeatureNm,
    etchedZones,
    outermostZoneWidthUm,
    paraxialOutermostZoneWidthUm: paraxialOutermostZoneWidthUm(lens, zoneCount),
    numericalAperture: numericalAperture(lens, zoneCount),
    smallAngleNumericalAperture: smallAngleNumericalAperture(lens.wavelengthNm, outermostZoneWidthUm),
    resolutionUm: rayleighResolutionUm(outermostZoneWidthUm),
    depthOfFocusPlusMinusUm: depthOfFocusPlusMinusUm(lens.wavelengthNm, outermostZoneWidthUm),
    maxRelativeBandwidth: maxRelativeBandwidth(zoneCount),
    idealFirstOrderEfficiency: {
      amplitudePlate: AMPLITUDE_PLATE_FIRST_ORDER_EFFICIENCY,
      phasePlate: PHASE_PLATE_FIRST_ORDER_EFFICIENCY,
    },
    orders: diffractionOrders(lens, outermostZoneWidthUm, LISTED_MAX_ORDER),
    zones,
    thinApproximationAtRim: {
      differenceUm: rim.thinDifferenceUm,
      relativeDifference: rim.thinRelativeDifference,
      differenceInZoneWidths: rim.thinDifferenceInZoneWidths,
    },
    // Odd zones 1, 3, … up to N number ⌈N/2⌉; even ones ⌊N/2⌋.
    etchedZoneCount: etchedZones === 'odd' ? Math.ceil(zoneCount / 2) : Math.floor(zoneCount / 2),
    warnings,
  };
}

/** The part of a design worth storing with the device (see `ZonePlateDesignSummary`). */
export function summarizeZonePlateDesign(design: ZonePlateDesign): ZonePlateDesignSummary {
  return {
    kind: 'fresnel-zone-plate',
    version: 1,
    radii: 'exact',
    wavelengthNm: design.wavelengthNm,
    focalLengthUm: design.focalLengthUm,
    apertureDiameterUm: design.apertureDiameterUm,
    zoneCount: design.zoneCount,
    lensDiameterUm: design.lensDiameterUm,
    etchedZones: design.etchedZones,
    minFeatureNm: design.minFeatureNm,
    outermostZoneWidthUm: design.outermostZoneWidthUm,
    numericalAperture: design.numericalAperture,
    resolutionUm: design.resolutionUm,
    depthOfFocusPlusMinusUm: design.depthOfFocusPlusMinusUm,
    maxRelativeBandwidth: design.maxRelativeBandwidth,
    idealFirstOrderEfficiency: { ...design.idealFirstOrderEfficiency },
    thinApproximationErrorAtRimUm: design.thinApproximationAtRim.differenceUm,
    warnings: design.warnings.map((warning) => ({ ...warning })),
  };
}
