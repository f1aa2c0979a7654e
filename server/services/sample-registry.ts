import { randomInt } from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';
import type { Knex } from 'knex';
import { CODE_BODY_LENGTH, formatCode } from '../../shared/codes';
import { SAMPLE_CODE_PREFIXES, type SampleKind, type SampleStatus } from '../../shared/samples';
import type { SampleProperties } from '../../shared/schemas/sample';
import { notFound, StaleVersionError } from '../errors';
import { SampleModel } from '../models/sample-model';
import { UserModel } from '../models/user-model';
import { presentSample } from '../presenters/sample-presenter';
import { appendHistory, type NewHistoryEvent } from './history-chain';
import { findSampleByCode } from './sample-lookup';

/** A fresh code for a kind; random, so codes reveal nothing about order or count. */
export async function newSampleCode(trx: Knex.Transaction, kind: SampleKind): Promise<string> {
  for (;;) {
    const code = formatCode(SAMPLE_CODE_PREFIXES[kind], randomInt(32 ** CODE_BODY_LENGTH));
    const taken = await trx('samples').where({ code }).first('id');
    if (!taken) return code;
  }
}

export interface NewSample {
  kind: SampleKind;
  material: string;
  name?: string | null;
  note?: string | null;
  status?: SampleStatus;
  properties?: SampleProperties;
  ownerId: number;
  code?: string;
}

/** Inserts samples and returns them; the caller writes their history (it knows the step). */
export async function insertSamples(trx: Knex.Transaction, actorId: number, samples: NewSample[]): Promise<SampleModel[]> {
  const created: SampleModel[] = [];
  for (const sample of samples) {
    created.push(
      await SampleModel.query(trx).insertAndFetch({
        code: sample.code ?? (await newSampleCode(trx, sample.kind)),
        kind: sample.kind,
        material: sample.material,
        name: sample.name || null,
        note: sample.note || null,
        status: sample.status ?? 'ready',
        properties: sample.properties ?? {},
        ownerId: sample.ownerId,
        createdById: actorId,
      }),
    );
  }
  return created;
}

export function createdEvent(actorId: number, sample: SampleModel, stepId: number | null = null): NewHistoryEvent {
  return {
    type: 'sample.created',
    actorId,
    subjectCode: sample.code,
    stepId,
    payload: {
      kind: sample.kind,
      material: sample.material,
      name: sample.name,
      status: sample.status,
      ownerId: sample.ownerId,
      note: sample.note,
      properties: sample.properties,
    },
  };
}

export async function registerSample(props: { trx: Knex.Transaction; actor: UserModel; input: Omit<NewSample, 'ownerId'> }) {
  const [sample] = await insertSamples(props.trx, props.actor.id, [{ ...props.input, ownerId: props.actor.id }]);
  await appendHistory(props.trx, [createdEvent(props.actor.id, sample)]);
  return sample;
}

type EditableField = 'material' | 'name' | 'note' | 'status' | 'ownerId' | 'properties';

/**
 * Applies an edit made from `version`. A stale edit is refused with the record as it is now;
 * the history gets one event with each changed field's old and new value (and a separate one
 * for a status change, which people look for).
 */
export async function editSample(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  code: string;
  version: number;
  changes: Partial<Pick<SampleModel, EditableField>>;
}): Promise<SampleModel> {
  const sample = await findSampleByCode(props.code, { trx: props.trx, lock: true });
  if (sample.version !== props.version) {
    throw new StaleVersionError(
      `${sample.code} was changed by someone else since you opened it (version ${props.version}, now ${sample.version}). Review the current record and edit again.`,
      await presentSample(props.trx, sample),
    );
  }
  if (sample.status === 'retired') {
    throw new StaleVersionError(
      `${sample.code} is retired; retired records are kept as they are.`,
      await presentSample(props.trx, sample),
    );
  }
  if (props.changes.ownerId !== undefined && !(await UserModel.query(props.trx).findById(props.changes.ownerId))) {
    throw notFound(`There is no person with id ${props.changes.ownerId} to own ${sample.code}.`);
  }
  const changed: Record<string, { from: unknown; to: unknown }> = {};
  for (const [field, value] of Object.entries(props.changes) as [EditableField, unknown][]) {
    if (value === undefined) continue;
    const before = sample[field] ?? null;
    if (!isDeepStrictEqual(before, value)) changed[field] = { from: before, to: value };
  }
  if (Object.keys(changed).length === 0) return sample;

  const patch = Object.fromEntries(Object.entries(changed).map(([field, change]) => [field, change.to]));
  const updated = await sample.$query(props.trx).patchAndFetch({ ...patch, version: sample.version + 1 });
  const events: NewHistoryEvent[] = [];
  const { status, ...fields } = changed;
  if (Object.keys(fields).length) {
    events.push({
      type: 'sample.edited',
      actorId: props.actor.id,
      subjectCode: sample.code,
      payload: { version: updated.version, changes: fields },
    });
  }
  if (status) {
    events.push({
      type: 'sample.status_changed',
      actorId: props.actor.id,
      subjectCode: sample.code,
      payload: { version: updated.version, ...status },
    });
  }
  await appendHistory(props.trx, events);
  return updated;
}

/** A manager withdraws a record with a reason; nothing is deleted. */
export async function retireSample(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  code: string;
  version: number;
  reason: string;
}) {
  const sample = await findSampleByCode(props.code, { trx: props.trx, lock: true });
  if (sample.version !== props.version || sample.status === 'retired') {
    throw new StaleVersionError(
      sample.status === 'retired'
        ? `${sample.code} is already retired.`
        : `${sample.code} was changed since you opened it. Review it and retire again.`,
      await presentSample(props.trx, sample),
    );
  }
  // patchAndFetch updates `sample` in place, so keep the status it had.
  const previousStatus = sample.status;
  const updated = await sample
    .$query(props.trx)
    .patchAndFetch({ status: 'retired', retiredReason: props.reason, version: sample.version + 1 });
  await appendHistory(props.trx, [
    {
      type: 'sample.retired',
      actorId: props.actor.id,
      subjectCode: sample.code,
      payload: { version: updated.version, from: previousStatus, reason: props.reason },
    },
  ]);
  return updated;
}
