import type { Knex } from 'knex';
import { z } from 'zod';
import { FLAKE_MATERIAL_IDS, type FlakeMaterialId } from '../../shared/optics/materials';
import {
  EVIDENCE_METADATA_SCHEMAS,
  type EvidenceKind,
  type EvidenceMetadata,
  type EvidenceSubstrate,
  type MicrographMetadata,
} from '../../shared/schemas/evidence';
import type { SampleProperties } from '../../shared/schemas/sample';
import { invalid, type FieldErrors } from '../errors';
import { MicroscopeCalibrationModel } from '../models/evidence-models';
import type { SampleModel } from '../models/sample-model';

/** Checks metadata against the schema of its kind; problems come back under `metadata.<field>`. */
export function parseMetadata(kind: EvidenceKind, raw: unknown): EvidenceMetadata {
  const result = (EVIDENCE_METADATA_SCHEMAS[kind] as z.ZodType<EvidenceMetadata>).safeParse(raw);
  if (result.success) return result.data;
  const fields: FieldErrors = {};
  for (const issue of result.error.issues) (fields[['metadata', ...issue.path.map(String)].join('.')] ??= []).push(issue.message);
  throw invalid(fields, 'Some details of the file need attention.');
}

/** The metadata text field of an upload: JSON, checked against the kind's schema. */
export function parseMetadataJson(kind: EvidenceKind, text: string): EvidenceMetadata {
  let raw: unknown;
  try {
    raw = JSON.parse(text || '{}');
  } catch {
    throw invalid({ metadata: ['The metadata is not valid JSON.'] });
  }
  return parseMetadata(kind, raw);
}

/** A sample's material as one Flakeline has optical and spectroscopic data for, ignoring case. */
export function knownMaterial(material: string): FlakeMaterialId | undefined {
  const wanted = material.trim().toLowerCase();
  return FLAKE_MATERIAL_IDS.find((id) => id.toLowerCase() === wanted);
}

/** The optics substrate a sample's recorded substrate and oxide describe, if they describe one. */
export function substrateFromProperties(properties: SampleProperties | null | undefined): EvidenceSubstrate | undefined {
  switch (properties?.substrate) {
    case 'si_sio2':
      return properties.oxideThicknessNm !== undefined
        ? { kind: 'oxide-on-silicon', oxideThicknessNm: properties.oxideThicknessNm }
        : undefined;
    case 'sapphire':
      return { kind: 'sapphire' };
    case 'quartz':
      return { kind: 'quartz' };
    default:
      return undefined;
  }
}

/** The substrate of a sample, or of the sample it was made from (a flake lies on its chip). */
async function recordedSubstrate(
  knex: Knex,
  sample: SampleModel,
): Promise<{ substrate: EvidenceSubstrate; from: string } | undefined> {
  const own = substrateFromProperties(sample.properties);
  if (own) return { substrate: own, from: sample.code };
  const parents: { code: string; properties: SampleProperties }[] = await knex('lineage_links as l')
    .join('samples as p', 'p.id', 'l.parent_id')
    .where('l.child_id', sample.id)
    .orderBy('p.id')
    .select('p.code', 'p.properties');
  for (const parent of parents) {
    const substrate = substrateFromProperties(parent.properties);
    if (substrate) return { substrate, from: parent.code };
  }
  return undefined;
}

/**
 * Fills what the researcher left out from records Flakeline already has: µm per pixel from the
 * named calibration, the material from the sample, the substrate from the sample or its parent.
 * The filled metadata is stored, so the evidence says what its analysis assumed.
 */
export async function completeMetadata(props: {
  knex: Knex;
  kind: EvidenceKind;
  metadata: EvidenceMetadata;
  sample: SampleModel | null;
}): Promise<EvidenceMetadata> {
  const { knex, kind, sample } = props;
  const metadata = { ...props.metadata };
  if (!metadata.material && sample) {
    const material = knownMaterial(sample.material);
    if (material) metadata.material = material;
  }
  if (kind !== 'micrograph') return metadata;

  const micrograph = metadata as MicrographMetadata;
  if (micrograph.calibrationId !== undefined) {
    const calibration = await MicroscopeCalibrationModel.query(knex).findById(micrograph.calibrationId);
    if (!calibration)
      throw invalid({ 'metadata.calibrationId': [`There is no calibration with id ${micrograph.calibrationId}.`] });
    if (
      micrograph.objectiveMagnification !== undefined &&
      micrograph.objectiveMagnification !== calibration.objectiveMagnification
    ) {
      throw invalid({
        'metadata.objectiveMagnification': [
          `Calibration ${calibration.id} is for the ${calibration.objectiveMagnification}× objective, not ${micrograph.objectiveMagnification}×.`,
        ],
      });
    }
    micrograph.objectiveMagnification = calibration.objectiveMagnification;
    micrograph.umPerPixel = calibration.umPerPixel;
  }
  if (!micrograph.substrate && sample) {
    const recorded = await recordedSubstrate(knex, sample);
    if (recorded) micrograph.substrate = recorded.substrate;
  }
  return micrograph;
}
