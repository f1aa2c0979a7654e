import type { Knex } from 'knex';
import type { StepCreate } from '../../shared/schemas/step';
import { STEP_TYPE_LABELS } from '../../shared/steps';
import { AppError, invalid, lineageCycle, notFound, sampleUnavailable, type FieldErrors } from '../errors';
import { SampleModel } from '../models/sample-model';
import { StepModel } from '../models/step-model';
import { UserModel } from '../models/user-model';
import { appendHistory, type NewHistoryEvent } from './history-chain';
import { cycleThrough } from './lineage';
import { findSampleByCode } from './sample-lookup';
import { createdEvent, insertSamples, type NewSample } from './sample-registry';

// Any fixed number: serialises steps that link existing samples, so two such steps cannot
// each pass the cycle check and together close a loop.
const LINEAGE_LOCK_KEY = 0x4c696e65;

/** Statuses a sample cannot be used from. */
const UNUSABLE = new Set(['used_up', 'discarded', 'retired', 'missing']);

async function resolveAll(trx: Knex.Transaction, codes: string[], field: string, errors: FieldErrors) {
  const found: SampleModel[] = [];
  for (const [index, code] of codes.entries()) {
    try {
      found.push(await findSampleByCode(code, { trx }));
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      (errors[`${field}.${index}`] ??= []).push(error.message);
    }
  }
  return found;
}

/**
 * Locks every named sample in one statement, in id order, so two steps naming the same samples
 * in different orders queue up instead of deadlocking; returns the rows as they are once locked.
 */
async function lockInIdOrder(trx: Knex.Transaction, samples: SampleModel[]): Promise<Map<number, SampleModel>> {
  const ids = [...new Set(samples.map((sample) => sample.id))];
  const locked = ids.length ? await SampleModel.query(trx).whereIn('id', ids).orderBy('id').forUpdate() : [];
  return new Map(locked.map((sample) => [sample.id, sample]));
}

/**
 * Logs a step with everything it used, treated and made, in the caller's transaction: the step,
 * its new samples, the parent → child links, used-up inputs, and the history. Any failure rolls
 * all of it back, so no half-logged step and no orphan outputs remain.
 */
export async function logStep(props: { trx: Knex.Transaction; actor: UserModel; input: StepCreate }) {
  const { trx, actor, input } = props;
  const errors: FieldErrors = {};
  const named = {
    inputs: await resolveAll(
      trx,
      input.inputs.map((item) => item.code),
      'inputs',
      errors,
    ),
    treated: await resolveAll(trx, input.treated, 'treated', errors),
    existingOutputs: await resolveAll(trx, input.existingOutputs, 'existingOutputs', errors),
  };
  if (Object.keys(errors).length) throw invalid(errors, 'Some of the samples named in this step could not be found.');

  // A sample listed twice is a slip, except an input named as an output: that is a loop, which
  // the cycle check below names as such.
  const seen = new Map<string, string>();
  for (const [field, list] of Object.entries(named)) {
    for (const [index, sample] of list.entries()) {
      const earlier = seen.get(sample.code);
      const isLoop = earlier === 'inputs' && field === 'existingOutputs';
      if (earlier && !isLoop) (errors[`${field}.${index}`] ??= []).push(`${sample.code} is already listed under ${earlier}.`);
      seen.set(sample.code, field);
    }
  }
  if (Object.keys(errors).length) throw invalid(errors, 'A sample can take part in a step only once.');

  const locked = await lockInIdOrder(trx, [...named.inputs, ...named.treated, ...named.existingOutputs]);
  const current = (list: SampleModel[]) => list.map((sample) => locked.get(sample.id) ?? sample);
  const inputs = current(named.inputs);
  const treated = current(named.treated);
  const existingOutputs = current(named.existingOutputs);

  const unusable = [...inputs, ...treated].filter((sample) => UNUSABLE.has(sample.status));
  if (unusable.length) {
    throw sampleUnavailable(
      `${unusable.map((sample) => `${sample.code} is ${sample.status.replace('_', ' ')}`).join('; ')}. Change its status first if that is wrong.`,
    );
  }

  const operatorId = input.operatorId ?? actor.id;
  const operator = await UserModel.query(trx).findById(operatorId);
  if (!operator) throw notFound(`There is no person with id ${operatorId} to be the operator.`);

  if (existingOutputs.length) {
    await trx.raw('select pg_advisory_xact_lock(?)', [LINEAGE_LOCK_KEY]);
    const loop = await cycleThrough(
      trx,
      inputs.map((sample) => sample.id),
      existingOutputs.map((sample) => sample.id),
    );
    if (loop) {
      throw lineageCycle(`This would make ${loop[0]} its own ancestor: ${loop.join(' → ')}.`, {
        existingOutputs: [`Loop: ${loop.join(' → ')}`],
      });
    }
  }

  const step = await StepModel.query(trx).insertAndFetch({
    type: input.type,
    operatorId,
    startedAt: new Date(input.startedAt),
    endedAt: input.endedAt ? new Date(input.endedAt) : null,
    instrument: input.instrument || null,
    parameters: input.parameters as Record<string, unknown>,
    notes: input.notes || null,
    createdById: actor.id,
  });

  const commonMaterial =
    inputs.length && inputs.every((sample) => sample.material === inputs[0].material) ? inputs[0].material : undefined;
  const newSamples: NewSample[] = [];
  for (const [index, output] of input.outputs.entries()) {
    const material = output.material ?? commonMaterial;
    if (!material) {
      (errors[`outputs.${index}.material`] ??= []).push('Name the material: the inputs do not share one.');
      continue;
    }
    for (let copy = 1; copy <= output.count; copy += 1) {
      const name = output.name && output.count > 1 ? `${output.name} ${copy}` : output.name;
      newSamples.push({ kind: output.kind, material, name, properties: output.properties, ownerId: actor.id });
    }
  }
  if (Object.keys(errors).length) throw invalid(errors);
  const created = await insertSamples(trx, actor.id, newSamples);
  const children = [...created, ...existingOutputs];

  const participation = [
    ...inputs.map((sample, position) => ({
      stepId: step.id,
      sampleId: sample.id,
      role: 'input',
      position,
      consumed: input.inputs[position].consumed,
    })),
    ...treated.map((sample, position) => ({ stepId: step.id, sampleId: sample.id, role: 'treated', position, consumed: false })),
    ...children.map((sample, position) => ({ stepId: step.id, sampleId: sample.id, role: 'output', position, consumed: false })),
  ];
  if (participation.length) await trx('step_samples').insert(participation);
  const links = inputs.flatMap((parent) =>
    children.map((child) => ({ parentId: parent.id, childId: child.id, stepId: step.id })),
  );
  if (links.length) await trx('lineage_links').insert(links);

  const consumed = inputs.filter((_sample, position) => input.inputs[position].consumed);
  if (consumed.length) {
    await trx('samples')
      .whereIn(
        'id',
        consumed.map((sample) => sample.id),
      )
      .update({ status: 'used_up', version: trx.raw('version + 1'), updatedAt: trx.fn.now() });
  }

  const events: NewHistoryEvent[] = [
    {
      type: 'step.logged',
      actorId: actor.id,
      stepId: step.id,
      payload: {
        type: step.type,
        label: STEP_TYPE_LABELS[step.type],
        operatorId,
        startedAt: input.startedAt,
        endedAt: input.endedAt ?? null,
        instrument: step.instrument,
        parameters: step.parameters,
        notes: step.notes,
        inputs: inputs.map((sample, position) => ({ code: sample.code, consumed: input.inputs[position].consumed })),
        treated: treated.map((sample) => sample.code),
        outputs: children.map((sample) => sample.code),
      },
    },
    ...inputs.map((sample, position) => ({
      type: 'sample.used' as const,
      actorId: actor.id,
      subjectCode: sample.code,
      stepId: step.id,
      payload: { stepType: step.type, consumed: input.inputs[position].consumed, outputs: children.map((child) => child.code) },
    })),
    ...consumed.map((sample) => ({
      type: 'sample.status_changed' as const,
      actorId: actor.id,
      subjectCode: sample.code,
      stepId: step.id,
      payload: { from: sample.status, to: 'used_up' },
    })),
    ...treated.map((sample) => ({
      type: 'sample.treated' as const,
      actorId: actor.id,
      subjectCode: sample.code,
      stepId: step.id,
      payload: { stepType: step.type },
    })),
    ...created.map((sample) => createdEvent(actor.id, sample, step.id)),
    ...existingOutputs.map((sample) => ({
      type: 'sample.linked' as const,
      actorId: actor.id,
      subjectCode: sample.code,
      stepId: step.id,
      payload: { stepType: step.type, parents: inputs.map((parent) => parent.code) },
    })),
  ];
  await appendHistory(trx, events);
  return step;
}
