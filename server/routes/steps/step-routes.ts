import { ChainVerification } from '../../../shared/schemas/history';
import { IdParam } from '../../../shared/schemas/fields';
import { IdempotencyKey, StepCreateInput, StepEnvelope, StepList, StepListQuery } from '../../../shared/schemas/step';
import { WRITER_ROLES } from '../../../shared/roles';
import { unusualParameterValues, unusualStepValues } from '../../../shared/step-warnings';
import type { AppContext } from '../../app-context';
import { invalid, notFound } from '../../errors';
import { route, type AnyRouteSpec } from '../../http/route';
import { StepModel } from '../../models/step-model';
import { presentStep } from '../../presenters/step-presenter';
import { verifyHistory } from '../../services/history-chain';
import { recentSteps } from '../../services/recent-steps';
import { logStep } from '../../services/step-logger';
import { logStepOnce } from '../../services/step-submissions';

/** The `Idempotency-Key` header when one was sent; a malformed key is refused before anything is logged. */
function idempotencyKeyOf(header: string | undefined): string | undefined {
  if (header === undefined) return undefined;
  const parsed = IdempotencyKey.safeParse(header);
  if (!parsed.success) throw invalid({ 'idempotency-key': parsed.error.issues.map((issue) => issue.message) });
  return parsed.data;
}

export function stepRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  return [
    route({
      method: 'post',
      path: '/steps',
      tag: 'Steps',
      summary:
        'Log a step with the samples it used, treated and made, all in one transaction. With an Idempotency-Key ' +
        'header, a resend of the same body answers with the first step (header Idempotent-Replayed: true).',
      access: WRITER_ROLES,
      body: StepCreateInput,
      response: StepEnvelope,
      successStatus: 201,
      errors: [404, 409],
      handler: async ({ user, body, req, res }) => {
        const idempotencyKey = idempotencyKeyOf(req.get('idempotency-key'));
        const { step, replayed } = await knex.transaction(async (trx) =>
          idempotencyKey
            ? logStepOnce({ trx, actor: user, input: body, idempotencyKey })
            : { step: await logStep({ trx, actor: user, input: body }), replayed: false },
        );
        if (replayed) res.setHeader('Idempotent-Replayed', 'true');
        // A replay answers with the warnings of the stored step, which are those of the first body.
        const warnings = replayed ? unusualParameterValues(step.type, step.parameters) : unusualStepValues(body);
        return { step: await presentStep(knex, step), warnings };
      },
    }),
    route({
      method: 'get',
      path: '/steps',
      tag: 'Steps',
      summary: 'The newest steps first, optionally only your own and of one type (bench view, repeating a run)',
      access: 'signed-in',
      query: StepListQuery,
      response: StepList,
      handler: async ({ user, query }) => {
        const steps = await recentSteps({ trx: knex, viewer: user, filters: query });
        return { steps: await Promise.all(steps.map((step) => presentStep(knex, step))) };
      },
    }),
    route({
      method: 'get',
      path: '/steps/:id',
      tag: 'Steps',
      summary: 'One step with its operator, parameters and samples',
      access: 'signed-in',
      params: IdParam,
      response: StepEnvelope,
      errors: [404],
      handler: async ({ params }) => {
        const step = await StepModel.query(knex).findById(params.id);
        if (!step) throw notFound(`There is no step with id ${params.id}.`);
        return { step: await presentStep(knex, step), warnings: unusualParameterValues(step.type, step.parameters) };
      },
    }),
    route({
      method: 'get',
      path: '/history/verify',
      tag: 'History',
      summary: "Recompute the whole history chain's hashes and name the first event that fails",
      access: 'signed-in',
      response: ChainVerification,
      handler: () => verifyHistory(knex),
    }),
  ];
}
