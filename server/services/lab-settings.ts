import type { Knex } from 'knex';
import { DEFAULT_MIN_FEATURE_NM } from '../../shared/zone-plate/limits';
import { LabSettingsModel } from '../models/device-models';
import type { UserModel } from '../models/user-model';
import { appendHistory } from './history-chain';

const SETTINGS_ID = 1;

/** The lab's settings row, or null while Flakeline's defaults apply. */
export async function labSettingsRow(knex: Knex | Knex.Transaction): Promise<LabSettingsModel | null> {
  return (await LabSettingsModel.query(knex).findById(SETTINGS_ID)) ?? null;
}

/** The smallest feature the lab's lithography writes, nm: the manager's setting or the default. */
export async function labMinFeatureNm(knex: Knex | Knex.Transaction): Promise<number> {
  return (await labSettingsRow(knex))?.minFeatureNm ?? DEFAULT_MIN_FEATURE_NM;
}

/** Saves the settings (one row, created on first save) with a history event naming the change. */
export async function updateLabSettings(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  minFeatureNm: number;
}): Promise<LabSettingsModel> {
  const { trx, actor, minFeatureNm } = props;
  const before = await LabSettingsModel.query(trx).findById(SETTINGS_ID).forUpdate();
  const from = before?.minFeatureNm ?? DEFAULT_MIN_FEATURE_NM;
  await trx('lab_settings')
    .insert({ id: SETTINGS_ID, minFeatureNm, updatedById: actor.id, updatedAt: trx.fn.now() })
    .onConflict('id')
    .merge();
  if (from !== minFeatureNm || !before) {
    await appendHistory(trx, [
      { type: 'lab_settings.changed', actorId: actor.id, payload: { minFeatureNm: { from, to: minFeatureNm } } },
    ]);
  }
  return LabSettingsModel.query(trx).findById(SETTINGS_ID).throwIfNotFound();
}
