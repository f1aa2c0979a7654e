/**
 * Fresnel zone-plate lens designs: what a lab types (wavelength, focal length, aperture or zone
 * count, its lithography limit) and the summary stored with the device it patterns from a flake.
 * The optics live in shared/zone-plate/; the cross-field rules and their messages in
 * shared/zone-plate/validation.ts so that the schema and `designZonePlate` agree.
 */
import { z } from 'zod';
import {
  DEFAULT_ETCHED_ZONES,
  DEFAULT_MIN_FEATURE_NM,
  ETCHED_ZONE_CHOICES,
  MAX_APERTURE_DIAMETER_UM,
  MAX_FOCAL_LENGTH_UM,
  MAX_MIN_FEATURE_NM,
  MAX_WAVELENGTH_NM,
  MAX_ZONE_COUNT,
} from '../zone-plate/limits';
import { geometryProblems, ZONE_PLATE_MESSAGES as M } from '../zone-plate/validation';
import { ZONE_PLATE_WARNING_CODES } from '../zone-plate/warnings';

const positive = (notANumber: string, message: string) => z.number({ error: notANumber }).positive(message);

/**
 * Wavelength and focal length are required. Give the aperture diameter (the room on the flake),
 * the number of zones, or both: with both, the zone count is the design and must fit the aperture.
 */
export const ZonePlateDesignInput = z
  .object({
    wavelengthNm: positive(M.wavelengthNumber, M.wavelengthPositive).max(MAX_WAVELENGTH_NM, M.wavelengthMax),
    focalLengthUm: positive(M.focalLengthNumber, M.focalLengthPositive).max(MAX_FOCAL_LENGTH_UM, M.focalLengthMax),
    apertureDiameterUm: positive(M.apertureNumber, M.aperturePositive).max(MAX_APERTURE_DIAMETER_UM, M.apertureMax).optional(),
    zoneCount: z
      .number({ error: M.zoneCountWhole })
      .int(M.zoneCountWhole)
      .min(1, M.zoneCountMin)
      .max(MAX_ZONE_COUNT, M.zoneCountMax)
      .optional(),
    /** The smallest line the lab's e-beam + etch writes; 100 nm if not given (common practice, no source). */
    minFeatureNm: positive(M.minFeatureNumber, M.minFeaturePositive)
      .max(MAX_MIN_FEATURE_NM, M.minFeatureMax)
      .default(DEFAULT_MIN_FEATURE_NM),
    /** Which zones are etched away; odd (the central disc, 3, 5…) unless said otherwise. */
    etchedZones: z.enum(ETCHED_ZONE_CHOICES, { error: 'Choose odd or even zones to etch.' }).default(DEFAULT_ETCHED_ZONES),
  })
  .superRefine((input, context) => {
    // zod runs this even after a field failed a range check; geometryProblems skips bad fields.
    for (const problem of geometryProblems(input)) {
      context.addIssue({ code: 'custom', path: [problem.path], message: problem.message });
    }
  })
  .meta({ id: 'ZonePlateDesignInput' });
export type ZonePlateDesignInput = z.input<typeof ZonePlateDesignInput>;
export type ZonePlateDesignRequest = z.output<typeof ZonePlateDesignInput>;

export const ZonePlateWarning = z
  .object({ code: z.enum(ZONE_PLATE_WARNING_CODES), message: z.string() })
  .meta({ id: 'ZonePlateWarning' });

/**
 * A design as stored with a device: the inputs, the zone count actually used and the figures a
 * person compares lenses by. The radii are not stored: `radii: 'exact'` says they are
 * r_n = √(nλf + (nλ/2)²) for n = 1…zoneCount, so they can always be regenerated.
 */
export const ZonePlateDesignSummary = z
  .object({
    kind: z.literal('fresnel-zone-plate'),
    version: z.literal(1),
    radii: z.literal('exact'),
    wavelengthNm: z.number(),
    focalLengthUm: z.number(),
    /** The aperture the lab gave (null when only a zone count was given). */
    apertureDiameterUm: z.number().nullable(),
    zoneCount: z.number().int(),
    /** 2 r_N, the diameter of the patterned lens. */
    lensDiameterUm: z.number(),
    etchedZones: z.enum(ETCHED_ZONE_CHOICES),
    minFeatureNm: z.number(),
    outermostZoneWidthUm: z.number(),
    numericalAperture: z.number(),
    resolutionUm: z.number(),
    depthOfFocusPlusMinusUm: z.number(),
    maxRelativeBandwidth: z.number(),
    idealFirstOrderEfficiency: z.object({ amplitudePlate: z.number(), phasePlate: z.number() }),
    /** How far √(nλf) would have put the outermost edge, in µm. */
    thinApproximationErrorAtRimUm: z.number(),
    warnings: z.array(ZonePlateWarning),
  })
  .meta({ id: 'ZonePlateDesignSummary' });
export type ZonePlateDesignSummary = z.infer<typeof ZonePlateDesignSummary>;
