import type { Knex } from 'knex';
import type { CalibrationCreateInput } from '../../shared/schemas/evidence';
import { conflict, notFound } from '../errors';
import { MicroscopeCalibrationModel } from '../models/evidence-models';
import type { UserModel } from '../models/user-model';
import { appendHistory } from './history-chain';

// Any fixed number: serialises calibration changes so two people recalibrating the same
// objective at once queue up instead of one failing on the "one current" index.
const CALIBRATION_LOCK_KEY = 0x43616c69;

const describe = (calibration: MicroscopeCalibrationModel) => ({
  calibrationId: calibration.id,
  microscope: calibration.microscope,
  objectiveMagnification: calibration.objectiveMagnification,
  umPerPixel: calibration.umPerPixel,
});

/**
 * Records a calibration of a microscope and objective. The one it replaces (same microscope,
 * ignoring case, and objective) is retired, not changed: micrographs that named it keep their scale.
 */
export async function createCalibration(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  input: CalibrationCreateInput;
}): Promise<MicroscopeCalibrationModel> {
  const { trx, actor, input } = props;
  await trx.raw('select pg_advisory_xact_lock(?)', [CALIBRATION_LOCK_KEY]);
  const replaced = await MicroscopeCalibrationModel.query(trx)
    .whereRaw('lower(microscope) = lower(?)', [input.microscope.trim()])
    .where('objectiveMagnification', input.objectiveMagnification)
    .whereNull('retiredAt')
    .first();
  if (replaced) await MicroscopeCalibrationModel.query(trx).patch({ retiredAt: new Date() }).where('id', replaced.id);
  const calibration = await MicroscopeCalibrationModel.query(trx).insertAndFetch({
    microscope: input.microscope.trim(),
    objectiveMagnification: input.objectiveMagnification,
    umPerPixel: input.umPerPixel,
    note: input.note || null,
    createdById: actor.id,
  });
  await appendHistory(trx, [
    {
      type: 'calibration.created',
      actorId: actor.id,
      payload: { ...describe(calibration), note: calibration.note, replaces: replaced?.id ?? null },
    },
  ]);
  return MicroscopeCalibrationModel.query(trx).findById(calibration.id).withGraphFetched('createdBy').throwIfNotFound();
}

/** Retires a calibration: it stays for the micrographs that name it, but is no longer offered. */
export async function retireCalibration(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  id: number;
}): Promise<MicroscopeCalibrationModel> {
  const { trx, actor, id } = props;
  const calibration = await MicroscopeCalibrationModel.query(trx).findById(id).forUpdate();
  if (!calibration) throw notFound(`There is no calibration with id ${id}.`);
  if (calibration.retiredAt)
    throw conflict('conflict', `Calibration ${id} was already retired on ${calibration.retiredAt.toISOString().slice(0, 10)}.`);
  await MicroscopeCalibrationModel.query(trx).patch({ retiredAt: new Date() }).where('id', id);
  await appendHistory(trx, [{ type: 'calibration.retired', actorId: actor.id, payload: describe(calibration) }]);
  return MicroscopeCalibrationModel.query(trx).findById(id).withGraphFetched('createdBy').throwIfNotFound();
}

export async function listCalibrations(knex: Knex, includeRetired: boolean): Promise<MicroscopeCalibrationModel[]> {
  const query = MicroscopeCalibrationModel.query(knex)
    .withGraphFetched('createdBy')
    .orderBy([{ column: 'microscope' }, { column: 'objectiveMagnification' }, { column: 'id', order: 'desc' }]);
  if (!includeRetired) query.whereNull('retiredAt');
  return query;
}
