import { IdParam } from '../../../shared/schemas/fields';
import { StepTemplateCreateInput, StepTemplateEnvelope, StepTemplateList } from '../../../shared/schemas/step-template';
import { WRITER_ROLES } from '../../../shared/roles';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { presentStepTemplate } from '../../presenters/step-template-presenter';
import { createStepTemplate, deleteStepTemplate, listStepTemplates } from '../../services/step-templates';

const TAG = 'Step templates';

/** Each person's saved step templates: private to them, so no one else's ids are even confirmed. */
export function stepTemplateRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  return [
    route({
      method: 'get',
      path: '/step-templates',
      tag: TAG,
      summary: 'Your saved step templates, by name',
      access: 'signed-in',
      response: StepTemplateList,
      handler: async ({ user }) => ({
        templates: (await listStepTemplates({ trx: knex, owner: user })).map(presentStepTemplate),
      }),
    }),
    route({
      method: 'post',
      path: '/step-templates',
      tag: TAG,
      summary: 'Save a step template: parameters, instrument, notes and output kinds (per-run fields are dropped)',
      access: WRITER_ROLES,
      body: StepTemplateCreateInput,
      response: StepTemplateEnvelope,
      successStatus: 201,
      errors: [409],
      handler: async ({ user, body }) => {
        const template = await knex.transaction((trx) => createStepTemplate({ trx, owner: user, input: body }));
        return { template: presentStepTemplate(template) };
      },
    }),
    route({
      method: 'delete',
      path: '/step-templates/:id',
      tag: TAG,
      summary: 'Delete one of your step templates',
      access: WRITER_ROLES,
      params: IdParam,
      errors: [404],
      handler: async ({ user, params }) => {
        await knex.transaction((trx) => deleteStepTemplate({ trx, owner: user, id: params.id }));
      },
    }),
  ];
}
