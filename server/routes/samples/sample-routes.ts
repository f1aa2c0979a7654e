import { HistoryList } from '../../../shared/schemas/history';
import { Lineage } from '../../../shared/schemas/lineage';
import {
  RetireSampleInput,
  SampleCodeParam,
  SampleCreateInput,
  SampleEnvelope,
  SampleListPage,
  SampleListQuery,
  SampleUpdateInput,
} from '../../../shared/schemas/sample';
import { WRITER_ROLES } from '../../../shared/roles';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { HistoryEventModel } from '../../models/history-event-model';
import type { SampleModel } from '../../models/sample-model';
import { presentHistoryEvent } from '../../presenters/history-presenter';
import { presentSample, presentSampleListRow } from '../../presenters/sample-presenter';
import { lineageOf, type LineageDirection } from '../../services/lineage';
import { findSampleByCode } from '../../services/sample-lookup';
import { editSample, registerSample, retireSample } from '../../services/sample-registry';
import { filteredSamples, LIST_COLUMNS, sortedSamples } from '../../services/sample-search';

const TAG = 'Samples';

export function sampleRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  const lineageRoute = (direction: LineageDirection) =>
    route({
      method: 'get',
      path: `/samples/:code/${direction}`,
      tag: TAG,
      summary: `Every ${direction === 'ancestors' ? 'ancestor' : 'descendant'} of a sample once, by generation, with the linking steps`,
      access: 'signed-in',
      params: SampleCodeParam,
      response: Lineage,
      errors: [404],
      handler: async ({ params }) => {
        const sample = await findSampleByCode(params.code);
        return { code: sample.code, direction, relatives: await lineageOf(knex, sample.id, direction) };
      },
    });

  return [
    route({
      method: 'get',
      path: '/samples',
      tag: TAG,
      summary: 'Samples matching filters, sorted and paged',
      access: 'signed-in',
      query: SampleListQuery,
      response: SampleListPage,
      handler: async ({ query }) => {
        const filtered = filteredSamples(knex, query);
        const [countRow, rows] = await Promise.all([
          filtered.clone().count<{ count: number }[]>({ count: '*' }).first(),
          sortedSamples(filtered.clone().select(LIST_COLUMNS), query)
            .limit(query.pageSize)
            .offset((query.page - 1) * query.pageSize),
        ]);
        return {
          samples: rows.map((row: SampleModel & { ownerName: string }) => presentSampleListRow(row)),
          total: Number(countRow?.count ?? 0),
          page: query.page,
          pageSize: query.pageSize,
        };
      },
    }),
    route({
      method: 'post',
      path: '/samples',
      tag: TAG,
      summary: 'Register a sample that did not come from a logged step (e.g. a source crystal)',
      access: WRITER_ROLES,
      body: SampleCreateInput,
      response: SampleEnvelope,
      successStatus: 201,
      handler: async ({ user, body }) => {
        const sample = await knex.transaction((trx) => registerSample({ trx, actor: user, input: body }));
        return { sample: await presentSample(knex, sample) };
      },
    }),
    route({
      method: 'get',
      path: '/samples/:code',
      tag: TAG,
      summary: 'One sample with its owner, the step that made it, parents and children (codes are read forgivingly)',
      access: 'signed-in',
      params: SampleCodeParam,
      response: SampleEnvelope,
      errors: [404],
      handler: async ({ params }) => ({ sample: await presentSample(knex, await findSampleByCode(params.code)) }),
    }),
    route({
      method: 'patch',
      path: '/samples/:code',
      tag: TAG,
      summary: 'Edit a sample from the version you read; a stale version gets 409 with the current record',
      access: WRITER_ROLES,
      params: SampleCodeParam,
      body: SampleUpdateInput,
      response: SampleEnvelope,
      errors: [404, 409],
      handler: async ({ user, params, body }) => {
        const { version, ...changes } = body;
        const sample = await knex.transaction((trx) => editSample({ trx, actor: user, code: params.code, version, changes }));
        return { sample: await presentSample(knex, sample) };
      },
    }),
    route({
      method: 'post',
      path: '/samples/:code/retirement',
      tag: TAG,
      summary: 'Retire a record with a reason (lab managers); nothing is deleted',
      access: ['manager'],
      params: SampleCodeParam,
      body: RetireSampleInput,
      response: SampleEnvelope,
      errors: [404, 409],
      handler: async ({ user, params, body }) => {
        const sample = await knex.transaction((trx) => retireSample({ trx, actor: user, code: params.code, ...body }));
        return { sample: await presentSample(knex, sample) };
      },
    }),
    lineageRoute('ancestors'),
    lineageRoute('descendants'),
    route({
      method: 'get',
      path: '/samples/:code/history',
      tag: TAG,
      summary: 'Everything that happened to one sample, oldest first',
      access: 'signed-in',
      params: SampleCodeParam,
      response: HistoryList,
      errors: [404],
      handler: async ({ params }) => {
        const sample = await findSampleByCode(params.code);
        const events = await HistoryEventModel.query(knex)
          .where('subjectCode', sample.code)
          .withGraphFetched('actor')
          .orderBy('id');
        return { events: events.map(presentHistoryEvent) };
      },
    }),
  ];
}
