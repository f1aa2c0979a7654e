import { WRITER_ROLES } from '../../../shared/roles';
import { SampleCodeParam } from '../../../shared/schemas/sample';
import {
  BoxCodeParam,
  BoxCreateInput,
  BoxEnvelope,
  BoxList,
  MoveSampleInput,
  SampleLocationEnvelope,
  StoragePlaceCreateInput,
  StoragePlaceEnvelope,
  StoragePlaceList,
} from '../../../shared/schemas/storage';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { findSampleByCode } from '../../services/sample-lookup';
import {
  boxDetail,
  createBox,
  createPlace,
  findBoxByCode,
  listBoxes,
  listPlaces,
  locationOf,
  moveSample,
} from '../../services/storage';

const TAG = 'Storage';

export function storageRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  return [
    route({
      method: 'get',
      path: '/places',
      tag: TAG,
      summary: 'Rooms, cabinets, desiccators, gloveboxes… that hold boxes',
      access: 'signed-in',
      response: StoragePlaceList,
      handler: async () => ({ places: await listPlaces(knex) }),
    }),
    route({
      method: 'post',
      path: '/places',
      tag: TAG,
      summary: 'Add a storage place (lab managers)',
      access: ['manager'],
      body: StoragePlaceCreateInput,
      response: StoragePlaceEnvelope,
      successStatus: 201,
      errors: [409],
      handler: async ({ body }) => {
        const created = await knex.transaction((trx) => createPlace(trx, body));
        const place = (await listPlaces(knex)).find((entry) => entry.id === created.id);
        return { place: place ?? { ...created, kind: body.kind, path: created.name, boxCount: 0 } };
      },
    }),
    route({
      method: 'get',
      path: '/boxes',
      tag: TAG,
      summary: 'Every sample box with where it is and how full it is',
      access: 'signed-in',
      response: BoxList,
      handler: async () => ({ boxes: await listBoxes(knex) }),
    }),
    route({
      method: 'post',
      path: '/boxes',
      tag: TAG,
      summary: 'Add a box with a grid of slots (lab managers); it gets its own code and label',
      access: ['manager'],
      body: BoxCreateInput,
      response: BoxEnvelope,
      successStatus: 201,
      handler: async ({ body }) => {
        const box = await knex.transaction((trx) => createBox(trx, body));
        return { box: await boxDetail(knex, box) };
      },
    }),
    route({
      method: 'get',
      path: '/boxes/:code',
      tag: TAG,
      summary: 'A box and what sits in each of its slots (codes are read forgivingly)',
      access: 'signed-in',
      params: BoxCodeParam,
      response: BoxEnvelope,
      errors: [404],
      handler: async ({ params }) => ({ box: await boxDetail(knex, await findBoxByCode(knex, params.code)) }),
    }),
    route({
      method: 'get',
      path: '/samples/:code/location',
      tag: TAG,
      summary: 'Which box and slot a sample is in (null when not put away)',
      access: 'signed-in',
      params: SampleCodeParam,
      response: SampleLocationEnvelope,
      errors: [404],
      handler: async ({ params }) => {
        const sample = await findSampleByCode(params.code);
        return { code: sample.code, location: await locationOf(knex, sample.id) };
      },
    }),
    route({
      method: 'put',
      path: '/samples/:code/location',
      tag: TAG,
      summary: 'Put a sample into a box slot, or move it; a taken slot gets 409 slot_taken',
      access: WRITER_ROLES,
      params: SampleCodeParam,
      body: MoveSampleInput,
      response: SampleLocationEnvelope,
      errors: [404, 409],
      handler: ({ user, params, body }) =>
        knex.transaction((trx) => moveSample({ trx, actor: user, code: params.code, to: body })),
    }),
    route({
      method: 'delete',
      path: '/samples/:code/location',
      tag: TAG,
      summary: 'Take a sample out of its box (e.g. onto the bench)',
      access: WRITER_ROLES,
      params: SampleCodeParam,
      response: SampleLocationEnvelope,
      errors: [404],
      handler: ({ user, params }) => knex.transaction((trx) => moveSample({ trx, actor: user, code: params.code, to: null })),
    }),
  ];
}
