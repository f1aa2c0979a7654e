import type { Knex } from 'knex';
import type { LensDesignInputRecord } from '../../shared/schemas/device';
import type { ZonePlateDesignRequest } from '../../shared/schemas/zone-plate';
import { SAMPLE_KIND_LABELS } from '../../shared/samples';
import {
  designZonePlate,
  fieldProblems,
  geometryProblems,
  lithographyWarning,
  radiiTableCsv,
  subwavelengthWarning,
  summarizeZonePlateDesign,
  type ZonePlateDesign,
  type ZonePlateWarning,
} from '../../shared/zone-plate';
import { invalid, notADevice, type FieldErrors } from '../errors';
import { LensDesignModel } from '../models/device-models';
import type { SampleModel } from '../models/sample-model';
import type { UserModel } from '../models/user-model';
import { appendHistory } from './history-chain';
import { labMinFeatureNm } from './lab-settings';

/** Lens designs and measurements belong to devices only. */
export function requireDevice(sample: SampleModel, what: string): void {
  if (sample.kind !== 'device') {
    throw notADevice(`${sample.code} is a ${SAMPLE_KIND_LABELS[sample.kind].toLowerCase()}; only a device can carry ${what}.`);
  }
}

/** The lithography step that made the device (the latest, if it was patterned more than once). */
export async function lithographyStepOf(knex: Knex | Knex.Transaction, deviceId: number): Promise<number | null> {
  const row = await knex('step_samples as ss')
    .join('steps as st', 'st.id', 'ss.step_id')
    .where({ 'ss.sample_id': deviceId, 'ss.role': 'output', 'st.type': 'lithography' })
    .orderBy('st.id', 'desc')
    .first('st.id');
  return row ? Number(row.id) : null;
}

/** The whole design from stored inputs (radii, orders…), recomputed: the radii are never stored. */
export function designFromRecord(input: LensDesignInputRecord): ZonePlateDesign {
  return designZonePlate({
    wavelengthNm: input.wavelengthNm,
    focalLengthUm: input.focalLengthUm,
    apertureDiameterUm: input.apertureDiameterUm ?? undefined,
    zoneCount: input.zoneCount ?? undefined,
    minFeatureNm: input.minFeatureNm,
    etchedZones: input.etchedZones,
  });
}

/** A stored design's warnings against a lithography limit that may have changed since it was saved. */
export function warningsAgainst(design: LensDesignModel, minFeatureNm: number): ZonePlateWarning[] {
  const { summary } = design;
  const lens = { wavelengthNm: summary.wavelengthNm, focalLengthUm: summary.focalLengthUm };
  return [
    lithographyWarning(lens, summary.zoneCount, summary.outermostZoneWidthUm, minFeatureNm),
    subwavelengthWarning(summary.wavelengthNm, summary.outermostZoneWidthUm),
  ].filter((warning): warning is ZonePlateWarning => warning !== null);
}

/** Newest first: [current, …earlier]. */
export async function designsOf(knex: Knex | Knex.Transaction, deviceId: number): Promise<LensDesignModel[]> {
  return LensDesignModel.query(knex).where('deviceId', deviceId).withGraphFetched('createdBy').orderBy('id', 'desc');
}

export async function currentDesignOf(knex: Knex | Knex.Transaction, deviceId: number): Promise<LensDesignModel | null> {
  return (await LensDesignModel.query(knex).where('deviceId', deviceId).orderBy('id', 'desc').first()) ?? null;
}

/**
 * Stores a new current design for a device, checked against the lab's lithography setting (which
 * replaces the form's own limit), attached to the lithography step that made the device.
 * Impossible designs are refused with the same field messages as the form's.
 */
export async function saveLensDesign(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  device: SampleModel;
  input: ZonePlateDesignRequest;
}): Promise<LensDesignModel> {
  const { trx, actor, device } = props;
  requireDevice(device, 'a lens design');
  const minFeatureNm = await labMinFeatureNm(trx);
  const record: LensDesignInputRecord = {
    wavelengthNm: props.input.wavelengthNm,
    focalLengthUm: props.input.focalLengthUm,
    apertureDiameterUm: props.input.apertureDiameterUm ?? null,
    zoneCount: props.input.zoneCount ?? null,
    minFeatureNm,
    etchedZones: props.input.etchedZones,
  };
  // The schema checked these already; checked again because the lab's limit replaced the form's.
  const problems = [...fieldProblems(props.input), ...geometryProblems(props.input)];
  if (problems.length) {
    const fields: FieldErrors = {};
    for (const problem of problems) (fields[problem.path] ??= []).push(problem.message);
    throw invalid(fields, 'This lens cannot be made as designed.');
  }
  const summary = summarizeZonePlateDesign(designFromRecord(record));
  const stepId = await lithographyStepOf(trx, device.id);
  const saved = await LensDesignModel.query(trx).insertAndFetch({
    deviceId: device.id,
    stepId,
    input: record,
    summary,
    createdById: actor.id,
  });
  await appendHistory(trx, [
    {
      type: 'lens_design.saved',
      actorId: actor.id,
      subjectCode: device.code,
      stepId,
      payload: {
        designId: saved.id,
        input: record,
        zoneCount: summary.zoneCount,
        lensDiameterUm: summary.lensDiameterUm,
        outermostZoneWidthUm: summary.outermostZoneWidthUm,
        warnings: summary.warnings.map((warning) => warning.code),
      },
    },
  ]);
  return saved;
}

/** The etched zones of a stored design as the CSV the lithography step writes from. */
export function radiiCsvOf(design: LensDesignModel): string {
  const full = designFromRecord(design.input);
  return radiiTableCsv(full.zones, full.etchedZones);
}
