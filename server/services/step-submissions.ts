import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { StepCreate } from '../../shared/schemas/step';
import { conflict } from '../errors';
import { StepModel } from '../models/step-model';
import type { UserModel } from '../models/user-model';
import { logStep } from './step-logger';

/** SHA-256 of the parsed body; zod builds objects in schema order, so equal steps hash equally. */
export const requestSha256 = (input: StepCreate) => createHash('sha256').update(JSON.stringify(input)).digest('hex');

/**
 * Logs a step once per (person, idempotency key), in the caller's transaction. A transaction-
 * scoped advisory lock on the pair makes a second submission with the same key (a double tap, a
 * resend after a dropped answer) wait until the first commits or rolls back; it then finds the
 * recorded key and gets the first step back instead of logging another. A key reused for a
 * different body is refused, since the client has mixed up two submissions.
 */
export async function logStepOnce(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  input: StepCreate;
  idempotencyKey: string;
}): Promise<{ step: StepModel; replayed: boolean }> {
  const { trx, actor, input, idempotencyKey } = props;
  const sha256 = requestSha256(input);
  await trx.raw('select pg_advisory_xact_lock(hashtextextended(?, 0))', [`step-submission:${actor.id}:${idempotencyKey}`]);
  const earlier = await trx('step_submissions').where({ userId: actor.id, idempotencyKey }).first();
  if (earlier) {
    if (earlier.requestSha256 !== sha256) {
      throw conflict(
        'idempotency_conflict',
        'This idempotency key was already used for a different step. Send a new key for a new step.',
      );
    }
    const step = await StepModel.query(trx).findById(earlier.stepId);
    // The foreign key keeps the step while its submission row exists.
    if (!step) throw new Error(`Step ${earlier.stepId} of an idempotent submission is missing.`);
    return { step, replayed: true };
  }
  const step = await logStep({ trx, actor, input });
  await trx('step_submissions').insert({ userId: actor.id, idempotencyKey, requestSha256: sha256, stepId: step.id });
  return { step, replayed: false };
}
