import type { Knex } from 'knex';
import type { StepTemplateCreate } from '../../shared/schemas/step-template';
import { conflict, notFound } from '../errors';
import { StepTemplateModel } from '../models/step-template-model';
import type { UserModel } from '../models/user-model';

export function listStepTemplates(props: { trx: Knex; owner: UserModel }) {
  return StepTemplateModel.query(props.trx).where('userId', props.owner.id).orderByRaw('lower(name)').orderBy('id');
}

/** Saves a template under the owner's name; names are unique per person, ignoring case. */
export async function createStepTemplate(props: { trx: Knex.Transaction; owner: UserModel; input: StepTemplateCreate }) {
  const { trx, owner, input } = props;
  // Checked first for a clear message; the unique index still decides between two racing saves.
  const taken = await StepTemplateModel.query(trx)
    .where('userId', owner.id)
    .whereRaw('lower(name) = lower(?)', [input.name])
    .first();
  if (taken) throw conflict('conflict', `You already have a template named "${taken.name}". Choose another name.`);
  return StepTemplateModel.query(trx).insertAndFetch({
    userId: owner.id,
    name: input.name,
    type: input.type,
    body: input.body as StepTemplateModel['body'],
  });
}

/** Deletes one of the owner's templates; someone else's id is answered as unknown, not forbidden. */
export async function deleteStepTemplate(props: { trx: Knex.Transaction; owner: UserModel; id: number }) {
  const deleted = await StepTemplateModel.query(props.trx).where({ id: props.id, userId: props.owner.id }).delete();
  if (!deleted) throw notFound(`You have no step template with id ${props.id}.`);
}
