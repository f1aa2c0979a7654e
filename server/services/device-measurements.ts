import type { Knex } from 'knex';
import type { MeasurementCreateInput } from '../../shared/schemas/device';
import type { z } from 'zod';
import { notFound } from '../errors';
import { DeviceMeasurementModel } from '../models/device-models';
import type { SampleModel } from '../models/sample-model';
import type { UserModel } from '../models/user-model';
import { appendHistory } from './history-chain';
import { requireDevice } from './lens-designs';

type MeasurementCreate = z.output<typeof MeasurementCreateInput>;

export async function measurementsOf(knex: Knex | Knex.Transaction, deviceId: number): Promise<DeviceMeasurementModel[]> {
  return DeviceMeasurementModel.query(knex)
    .where('deviceId', deviceId)
    .withGraphFetched('measuredBy')
    .orderBy([{ column: 'measuredAt' }, { column: 'id' }]);
}

/** Records a measurement on a device, by the person saving it, with its history event. */
export async function addMeasurement(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  device: SampleModel;
  input: MeasurementCreate;
}): Promise<DeviceMeasurementModel> {
  const { trx, actor, device, input } = props;
  requireDevice(device, 'device measurements');
  const saved = await DeviceMeasurementModel.query(trx).insertAndFetch({
    deviceId: device.id,
    kind: input.kind,
    rows: input.rows,
    instrument: input.instrument || null,
    note: input.note || null,
    measuredAt: new Date(input.measuredAt),
    measuredById: actor.id,
  });
  await appendHistory(trx, [
    {
      type: 'measurement.added',
      actorId: actor.id,
      subjectCode: device.code,
      payload: { measurementId: saved.id, kind: saved.kind, rowCount: saved.rows.length, measuredAt: input.measuredAt },
    },
  ]);
  return saved.$query(trx).withGraphFetched('measuredBy');
}

/** Removes a measurement; its rows go into the history event so nothing measured is lost. */
export async function deleteMeasurement(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  device: SampleModel;
  measurementId: number;
}): Promise<void> {
  const { trx, actor, device, measurementId } = props;
  const measurement = await DeviceMeasurementModel.query(trx).findOne({ id: measurementId, deviceId: device.id }).forUpdate();
  if (!measurement) throw notFound(`${device.code} has no measurement ${measurementId}.`);
  await DeviceMeasurementModel.query(trx).deleteById(measurement.id);
  await appendHistory(trx, [
    {
      type: 'measurement.deleted',
      actorId: actor.id,
      subjectCode: device.code,
      payload: {
        measurementId: measurement.id,
        kind: measurement.kind,
        rows: measurement.rows,
        instrument: measurement.instrument,
        measuredAt: measurement.measuredAt.toISOString(),
      },
    },
  ]);
}
