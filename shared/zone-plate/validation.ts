/**
 * Rules that tie the design inputs together (the zod schema in shared/schemas/zone-plate.ts
 * checks each field on its own and then asks this module). Kept here, free of zod, so that
 * `designZonePlate` refuses the same inputs with the same words when called directly.
 */
import { formatLengthUm, plural } from './format';
import { MAX_APERTURE_DIAMETER_UM, MAX_FOCAL_LENGTH_UM, MAX_MIN_FEATURE_NM, MAX_WAVELENGTH_NM, MAX_ZONE_COUNT } from './limits';
import { apertureDiameterForZoneCountUm, exactZoneRadiusUm, zoneCountForAperture, type ZonePlateLens } from './optics';

/** The inputs that decide the geometry; the rest (lithography limit, etched zones) only annotate it. */
export interface ZonePlateGeometryInput extends ZonePlateLens {
  apertureDiameterUm?: number;
  zoneCount?: number;
}

export interface ZonePlateInputProblem {
  path: 'wavelengthNm' | 'focalLengthUm' | 'apertureDiameterUm' | 'zoneCount' | 'minFeatureNm';
  message: string;
}

/** Field messages, shared by the schema's checks and `fieldProblems`. */
export const ZONE_PLATE_MESSAGES = {
  wavelengthNumber: 'Wavelength must be a number of nanometres.',
  focalLengthNumber: 'Focal length must be a number of micrometres.',
  apertureNumber: 'Aperture diameter must be a number of micrometres.',
  minFeatureNumber: 'The smallest feature must be a number of nanometres.',
  wavelengthPositive: 'Wavelength must be above zero.',
  wavelengthMax: `Wavelength can be at most ${formatLengthUm(MAX_WAVELENGTH_NM / 1000)}.`,
  focalLengthPositive: 'Focal length must be above zero.',
  focalLengthMax: `Focal length can be at most ${formatLengthUm(MAX_FOCAL_LENGTH_UM)}.`,
  aperturePositive: 'Aperture diameter must be above zero.',
  apertureMax: `The aperture can be at most ${formatLengthUm(MAX_APERTURE_DIAMETER_UM)} across.`,
  zoneCountWhole: 'The number of zones is a whole number.',
  zoneCountMin: 'Use at least one zone.',
  zoneCountMax: `Flakeline designs at most ${MAX_ZONE_COUNT} zones.`,
  minFeaturePositive: 'The smallest feature your lithography writes must be above zero.',
  minFeatureMax: `The smallest feature can be at most ${formatLengthUm(MAX_MIN_FEATURE_NM / 1000)}.`,
  apertureOrZoneCount: 'Give the aperture diameter or the number of zones.',
} as const;

const inRange = (value: number | undefined, max: number): value is number =>
  value !== undefined && Number.isFinite(value) && value > 0 && value <= max;

const isZoneCount = (value: number | undefined): value is number =>
  value !== undefined && Number.isSafeInteger(value) && value >= 1 && value <= MAX_ZONE_COUNT;

/** Each field on its own, for callers that bypass the schema. */
export function fieldProblems(input: ZonePlateGeometryInput & { minFeatureNm?: number }): ZonePlateInputProblem[] {
  const problems: ZonePlateInputProblem[] = [];
  const positiveWithin = (
    path: ZonePlateInputProblem['path'],
    value: number | undefined,
    max: number,
    positive: string,
    tooLarge: string,
  ) => {
    if (value === undefined) return;
    if (!Number.isFinite(value) || value <= 0) problems.push({ path, message: positive });
    else if (value > max) problems.push({ path, message: tooLarge });
  };
  const m = ZONE_PLATE_MESSAGES;
  positiveWithin('wavelengthNm', input.wavelengthNm, MAX_WAVELENGTH_NM, m.wavelengthPositive, m.wavelengthMax);
  positiveWithin('focalLengthUm', input.focalLengthUm, MAX_FOCAL_LENGTH_UM, m.focalLengthPositive, m.focalLengthMax);
  positiveWithin('apertureDiameterUm', input.apertureDiameterUm, MAX_APERTURE_DIAMETER_UM, m.aperturePositive, m.apertureMax);
  positiveWithin('minFeatureNm', input.minFeatureNm, MAX_MIN_FEATURE_NM, m.minFeaturePositive, m.minFeatureMax);
  const zones = input.zoneCount;
  if (zones !== undefined) {
    if (!Number.isSafeInteger(zones)) problems.push({ path: 'zoneCount', message: m.zoneCountWhole });
    else if (zones < 1) problems.push({ path: 'zoneCount', message: m.zoneCountMin });
    else if (zones > MAX_ZONE_COUNT) problems.push({ path: 'zoneCount', message: m.zoneCountMax });
  }
  return problems;
}

/**
 * What is wrong with the combination of inputs, assuming each field was checked on its own.
 * Fields that failed their own check are skipped here, so one mistake gives one message.
 *
 * When both the aperture and the zone count are given, the aperture is the room available (the
 * flake) and the zone count is the design: fewer zones than the aperture holds is fine, more is
 * an error. The missing-input message sits on `apertureDiameterUm`, the field a form shows first.
 */
export function geometryProblems(input: ZonePlateGeometryInput): ZonePlateInputProblem[] {
  if (!inRange(input.wavelengthNm, MAX_WAVELENGTH_NM) || !inRange(input.focalLengthUm, MAX_FOCAL_LENGTH_UM)) return [];
  const lens: ZonePlateLens = { wavelengthNm: input.wavelengthNm, focalLengthUm: input.focalLengthUm };
  const { apertureDiameterUm: aperture, zoneCount } = input;
  if (aperture === undefined && zoneCount === undefined) {
    return [{ path: 'apertureDiameterUm', message: ZONE_PLATE_MESSAGES.apertureOrZoneCount }];
  }

  let zonesInAperture: number | undefined;
  if (inRange(aperture, MAX_APERTURE_DIAMETER_UM)) {
    zonesInAperture = zoneCountForAperture(lens, aperture);
    if (zonesInAperture === 0) {
      // 2 r_1 ≤ D: the central disc alone needs 2√(λf + λ²/4).
      const firstZoneUm = 2 * exactZoneRadiusUm(lens, 1);
      return [
        {
          path: 'apertureDiameterUm',
          message: `Aperture too small for one zone: the first zone needs ${formatLengthUm(firstZoneUm)}.`,
        },
      ];
    }
  }

  if (isZoneCount(zoneCount)) {
    const neededUm = apertureDiameterForZoneCountUm(lens, zoneCount);
    if (zonesInAperture !== undefined && aperture !== undefined) {
      if (zoneCount > zonesInAperture) {
        return [
          {
            path: 'zoneCount',
            message: `${plural(zoneCount, 'zone needs', 'zones need')} an aperture of ${formatLengthUm(neededUm)}; the ${formatLengthUm(aperture)} aperture holds ${plural(zonesInAperture, 'zone', 'zones')}.`,
          },
        ];
      }
    } else if (aperture === undefined && neededUm > MAX_APERTURE_DIAMETER_UM) {
      return [
        {
          path: 'zoneCount',
          message: `${plural(zoneCount, 'zone needs', 'zones need')} an aperture of ${formatLengthUm(neededUm)} at this wavelength and focal length; Flakeline designs lenses up to ${formatLengthUm(MAX_APERTURE_DIAMETER_UM)} across.`,
        },
      ];
    }
    return [];
  }

  if (zoneCount === undefined && zonesInAperture !== undefined && zonesInAperture > MAX_ZONE_COUNT) {
    return [
      {
        path: 'apertureDiameterUm',
        message: `This aperture holds ${zonesInAperture <= 1e12 ? zonesInAperture : 'over 10¹²'} zones; Flakeline designs at most ${MAX_ZONE_COUNT}. Give a smaller aperture or the number of zones.`,
      },
    ];
  }
  return [];
}
