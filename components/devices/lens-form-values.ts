import { ZonePlateDesignInput, type ZonePlateDesignRequest } from '@/shared/schemas/zone-plate';
import { DEFAULT_ETCHED_ZONES, DEFAULT_MIN_FEATURE_NM, type EtchedZones } from '@/shared/zone-plate';

/** Lengths a person may type in either unit; the design itself is always in µm. */
export type LengthUnit = 'um' | 'mm';
/** The lens is sized by the room on the flake (aperture) or by a number of zones. */
export type LensSizeBy = 'aperture' | 'zones';

export const LENGTH_UNIT_LABELS: Record<LengthUnit, string> = { um: 'µm', mm: 'mm' };
const UM_PER_UNIT: Record<LengthUnit, number> = { um: 1, mm: 1000 };

/** What the designer's fields hold, as typed. */
export interface LensFormValues {
  wavelengthNm: string;
  focalLength: string;
  focalUnit: LengthUnit;
  sizeBy: LensSizeBy;
  aperture: string;
  apertureUnit: LengthUnit;
  zoneCount: string;
  etchedZones: EtchedZones;
}

/** The form's fields that can carry a message (the units and toggles cannot be wrong). */
export type LensFormField = 'wavelengthNm' | 'focalLength' | 'aperture' | 'zoneCount' | 'minFeatureNm';
export type LensFormErrors = Partial<Record<LensFormField, string[]>>;

export const EMPTY_LENS_FORM: LensFormValues = {
  wavelengthNm: '',
  focalLength: '',
  focalUnit: 'mm',
  sizeBy: 'aperture',
  aperture: '',
  apertureUnit: 'mm',
  zoneCount: '',
  etchedZones: DEFAULT_ETCHED_ZONES,
};

/** The schema's paths, renamed to the fields that show them. */
const FIELD_OF_PATH: Record<string, LensFormField> = {
  wavelengthNm: 'wavelengthNm',
  focalLengthUm: 'focalLength',
  apertureDiameterUm: 'aperture',
  zoneCount: 'zoneCount',
  minFeatureNm: 'minFeatureNm',
};

export function fieldOfPath(path: string): LensFormField | null {
  return FIELD_OF_PATH[path] ?? null;
}

/** A typed number with a decimal comma accepted (many lab keyboards use one); '' is "not given". */
function readNumber(text: string): number | undefined {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/** Drops the binary noise of a unit conversion (0.5 mm is 500 µm, not 500.00000000000006). */
const tidy = (value: number) => Number(value.toPrecision(12));

const NOT_A_NUMBER: Record<Exclude<LensFormField, 'minFeatureNm'>, string> = {
  wavelengthNm: 'Type the wavelength as a number of nanometres, e.g. 632.8.',
  focalLength: 'Type the focal length as a number.',
  aperture: 'Type the aperture diameter as a number.',
  zoneCount: 'Type the number of zones as a whole number.',
};

export type LensFormResult =
  { ok: true; input: ZonePlateDesignRequest } | { ok: false; errors: LensFormErrors; formErrors: string[]; blank: boolean };

/**
 * Reads the form into a design request in µm, checked by the same schema the server uses. Only
 * the chosen sizing is sent (aperture or zone count). `blank` says nothing has been typed yet,
 * so the screen can invite input rather than complain.
 */
export function parseLensForm(values: LensFormValues, minFeatureNm: number = DEFAULT_MIN_FEATURE_NM): LensFormResult {
  const wavelength = readNumber(values.wavelengthNm);
  const focal = readNumber(values.focalLength);
  const aperture = values.sizeBy === 'aperture' ? readNumber(values.aperture) : undefined;
  const zones = values.sizeBy === 'zones' ? readNumber(values.zoneCount) : undefined;
  const blank = wavelength === undefined && focal === undefined && aperture === undefined && zones === undefined;

  const errors: LensFormErrors = {};
  const typed: [Exclude<LensFormField, 'minFeatureNm'>, number | undefined][] = [
    ['wavelengthNm', wavelength],
    ['focalLength', focal],
    ['aperture', aperture],
    ['zoneCount', zones],
  ];
  for (const [field, value] of typed) if (Number.isNaN(value)) errors[field] = [NOT_A_NUMBER[field]];
  if (wavelength === undefined) errors.wavelengthNm = ['Give the design wavelength.'];
  if (focal === undefined) errors.focalLength = ['Give the focal length.'];

  const request = {
    wavelengthNm: wavelength,
    focalLengthUm: focal === undefined ? undefined : tidy(focal * UM_PER_UNIT[values.focalUnit]),
    apertureDiameterUm: aperture === undefined ? undefined : tidy(aperture * UM_PER_UNIT[values.apertureUnit]),
    zoneCount: zones,
    minFeatureNm,
    etchedZones: values.etchedZones,
  };
  const parsed = ZonePlateDesignInput.safeParse(request);
  if (parsed.success && Object.keys(errors).length === 0) return { ok: true, input: parsed.data };

  const formErrors: string[] = [];
  const ownErrors = new Set(Object.keys(errors));
  for (const issue of parsed.success ? [] : parsed.error.issues) {
    const field = fieldOfPath(String(issue.path[0] ?? ''));
    if (field === null) formErrors.push(issue.message);
    // A field this form already explained (empty, not a number) gets no second, unit-bound message.
    else if (!ownErrors.has(field)) errors[field] = [...new Set([...(errors[field] ?? []), issue.message])];
  }
  if (values.sizeBy === 'zones' && zones === undefined && errors.aperture) {
    // The schema puts "give the aperture or the zone count" on the aperture; here it is hidden.
    errors.zoneCount = errors.aperture;
    delete errors.aperture;
  }
  return { ok: false, errors, formErrors, blank };
}

/** Micrometres shown in the unit a person would type them in: mm from 1 mm up. */
function lengthForForm(valueUm: number): { text: string; unit: LengthUnit } {
  return valueUm >= 1000 ? { text: String(tidy(valueUm / 1000)), unit: 'mm' } : { text: String(valueUm), unit: 'um' };
}

/** The form filled from a stored design's inputs. */
export function lensFormFromInput(input: {
  wavelengthNm: number;
  focalLengthUm: number;
  apertureDiameterUm?: number | null;
  zoneCount?: number | null;
  etchedZones?: EtchedZones;
}): LensFormValues {
  const focal = lengthForForm(input.focalLengthUm);
  const hasAperture = input.apertureDiameterUm !== undefined && input.apertureDiameterUm !== null;
  const aperture = hasAperture ? lengthForForm(input.apertureDiameterUm as number) : { text: '', unit: 'mm' as const };
  return {
    wavelengthNm: String(input.wavelengthNm),
    focalLength: focal.text,
    focalUnit: focal.unit,
    sizeBy: hasAperture || input.zoneCount === undefined || input.zoneCount === null ? 'aperture' : 'zones',
    aperture: aperture.text,
    apertureUnit: aperture.unit,
    zoneCount: input.zoneCount === undefined || input.zoneCount === null ? '' : String(input.zoneCount),
    etchedZones: input.etchedZones ?? DEFAULT_ETCHED_ZONES,
  };
}

export { DEFAULT_MIN_FEATURE_NM };
