import { ChainVerification } from '../../../shared/schemas/history';
import { IdParam } from '../../../shared/schemas/fields';
import { StepCreateInput, StepEnvelope } from '../../../shared/schemas/step';
import { WRITER_ROLES } from '../../../shared/roles';
import type { AppContext } from '../../app-context';
import { notFound } from '../../errors';
import { route, type AnyRouteSpec } from '../../http/route';
import { StepModel } from '../../models/step-model';
import { presentStep } from '../../presenters/step-presenter';
import { verifyHistory } from '../../services/history-chain';
import { logStep } from '../../services/step-logger';

export function stepRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  return [
    route({
      method: 'post',
      path: '/steps',
      tag: 'Steps',
      summary: 'Log a step with the samples it used, treated and made, all in one transaction',
      access: WRITER_ROLES,
      body: StepCreateInput,
      response: StepEnvelope,
      successStatus: 201,
      errors: [404, 409],
      handler: async ({ user, body }) => {
        const step = await knex.transaction((trx) => logStep({ trx, actor: user, input: body }));
        return { step: await presentStep(knex, step) };
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
        return { step: await presentStep(knex, step) };
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
