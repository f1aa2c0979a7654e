import { FLAKE_MATERIAL_IDS, type FlakeMaterialId } from '@/shared/optics/materials';
import {
  EVIDENCE_METADATA_SCHEMAS,
  IMAGE_MAX_BYTES,
  SPECTRUM_MAX_BYTES,
  type EvidenceKind,
  type EvidenceMetadata,
  type EvidenceSubstrate,
} from '@/shared/schemas/evidence';
import type { Sample } from '@/shared/schemas/sample';
import { errorsFromIssues, type PathErrors } from '@/components/ui/field-errors';
import { numberFromText } from './number-text';
import { formatBytes } from './picked-file';

export type SubstrateKind = EvidenceSubstrate['kind'];

/** What the add-evidence form holds; typed numbers stay text until they are checked. */
export interface EvidenceFormValues {
  kind: EvidenceKind | null;
  material: FlakeMaterialId | null;
  calibrationId: number | null;
  illumination: 'white' | 'bandpass';
  filterCentreNm: string;
  exposureMs: string;
  substrateKind: SubstrateKind | null;
  oxideThicknessNm: string;
  pixelEncoding: 'as-recorded' | 'srgb';
  laserNm: string;
  xUnit: 'nm' | 'eV';
  referenceIntensity: string;
  offsetNm: string;
  note: string;
}

export const EMPTY_EVIDENCE_FORM: EvidenceFormValues = {
  kind: null,
  material: null,
  calibrationId: null,
  illumination: 'white',
  filterCentreNm: '',
  exposureMs: '',
  substrateKind: null,
  oxideThicknessNm: '',
  pixelEncoding: 'as-recorded',
  laserNm: '',
  xUnit: 'nm',
  referenceIntensity: '',
  offsetNm: '',
  note: '',
};

/** Common Raman/PL excitation lines (common practice, no source). */
export const LASER_PRESETS_NM = ['488', '532', '633', '785'] as const;
/** Common thermal-oxide thicknesses (common practice, no source); the same presets as the bench. */
export const OXIDE_PRESETS_NM = ['90', '285', '300'] as const;

/** The optics material a sample's free-text material names, if Flakeline has data for it ("mos2" → MoS2). */
export function flakeMaterialOf(material: string): FlakeMaterialId | null {
  const wanted = material.trim().toLowerCase();
  return FLAKE_MATERIAL_IDS.find((id) => id.toLowerCase() === wanted) ?? null;
}

/** The substrate a sample (or the chip it was found on) records, as the form's starting point. */
export function substrateFromSample(
  sample: Pick<Sample, 'properties'> | undefined,
): Pick<EvidenceFormValues, 'substrateKind' | 'oxideThicknessNm'> | null {
  const properties = sample?.properties;
  switch (properties?.substrate) {
    case 'si_sio2':
      return {
        substrateKind: 'oxide-on-silicon',
        oxideThicknessNm: properties.oxideThicknessNm === undefined ? '' : String(properties.oxideThicknessNm),
      };
    case 'sapphire':
      return { substrateKind: 'sapphire', oxideThicknessNm: '' };
    case 'quartz':
      return { substrateKind: 'quartz', oxideThicknessNm: '' };
    default:
      return null;
  }
}

function substrateOf(values: EvidenceFormValues): EvidenceSubstrate | undefined {
  switch (values.substrateKind) {
    case null:
      return undefined;
    case 'oxide-on-silicon':
      // NaN for a blank thickness: the schema then says the thickness is needed, beside the field.
      return { kind: 'oxide-on-silicon', oxideThicknessNm: numberFromText(values.oxideThicknessNm) ?? Number.NaN };
    default:
      return { kind: values.substrateKind };
  }
}

function rawMetadata(kind: EvidenceKind, values: EvidenceFormValues): Record<string, unknown> {
  const note = values.note.trim() || undefined;
  const material = values.material ?? undefined;
  switch (kind) {
    case 'micrograph':
      return {
        calibrationId: values.calibrationId ?? undefined,
        illumination:
          values.illumination === 'white'
            ? { kind: 'white' }
            : { kind: 'bandpass', centreNm: numberFromText(values.filterCentreNm) ?? Number.NaN },
        exposureMs: numberFromText(values.exposureMs),
        substrate: substrateOf(values),
        material,
        pixelEncoding: values.pixelEncoding,
        note,
      };
    case 'raman':
      return { laserNm: numberFromText(values.laserNm), material, note };
    case 'pl':
      return {
        laserNm: numberFromText(values.laserNm),
        material,
        xUnit: values.xUnit,
        referenceIntensity: numberFromText(values.referenceIntensity),
        note,
      };
    case 'afm':
      return { material, offsetNm: numberFromText(values.offsetNm), note };
  }
}

export type MetadataCheck = { ok: true; metadata: EvidenceMetadata } | { ok: false; errors: PathErrors };

/** The metadata for the server, checked by the same schema it uses; errors keyed by field. */
export function metadataFromForm(kind: EvidenceKind, values: EvidenceFormValues): MetadataCheck {
  const raw = Object.fromEntries(Object.entries(rawMetadata(kind, values)).filter(([, value]) => value !== undefined));
  const parsed = EVIDENCE_METADATA_SCHEMAS[kind].safeParse(raw);
  return parsed.success ? { ok: true, metadata: parsed.data } : { ok: false, errors: errorsFromIssues(parsed.error.issues) };
}

/** The server reports metadata problems as `metadata.<field>`; the form keys them by field. */
export function formErrorsFromServer(fields: PathErrors): PathErrors {
  const errors: PathErrors = {};
  for (const [key, messages] of Object.entries(fields)) errors[key.replace(/^metadata\./, '')] = messages;
  return errors;
}

export function isImageKind(kind: EvidenceKind): boolean {
  return kind === 'micrograph';
}

/** Refuses a file the server would refuse for its size, before a phone spends minutes sending it. */
export function sizeProblem(kind: EvidenceKind, byteSize: number | null): string | null {
  const limit = isImageKind(kind) ? IMAGE_MAX_BYTES : SPECTRUM_MAX_BYTES;
  if (byteSize === null || byteSize <= limit) return null;
  return isImageKind(kind)
    ? `This image is ${formatBytes(byteSize)}; micrographs up to ${formatBytes(limit)} are accepted. Save it as JPEG or PNG, or crop it to the area of interest.`
    : `This file is ${formatBytes(byteSize)}; spectra and profiles up to ${formatBytes(limit)} are accepted. Export only the two columns needed.`;
}
