import { WRITER_ROLES } from '../../../shared/roles';
import {
  CalibrationCreateInput,
  CalibrationEnvelope,
  CalibrationList,
  CalibrationListQuery,
} from '../../../shared/schemas/evidence';
import { IdParam } from '../../../shared/schemas/fields';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { presentCalibration } from '../../presenters/evidence-presenter';
import { createCalibration, listCalibrations, retireCalibration } from '../../services/calibrations';

const TAG = 'Microscope calibrations';

export function calibrationRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;
  return [
    route({
      method: 'get',
      path: '/microscope-calibrations',
      tag: TAG,
      summary: 'Current µm-per-pixel calibrations by microscope and objective (?includeRetired=true for all)',
      access: 'signed-in',
      query: CalibrationListQuery,
      response: CalibrationList,
      handler: async ({ query }) => ({
        calibrations: (await listCalibrations(knex, query.includeRetired ?? false)).map(presentCalibration),
      }),
    }),
    route({
      method: 'post',
      path: '/microscope-calibrations',
      tag: TAG,
      summary: 'Record a calibration; the current one of the same microscope and objective is retired, not changed',
      access: WRITER_ROLES,
      body: CalibrationCreateInput,
      response: CalibrationEnvelope,
      successStatus: 201,
      handler: async ({ user, body }) => ({
        calibration: presentCalibration(await knex.transaction((trx) => createCalibration({ trx, actor: user, input: body }))),
      }),
    }),
    route({
      method: 'post',
      path: '/microscope-calibrations/:id/retire',
      tag: TAG,
      summary: 'Retire a calibration: micrographs that name it keep it, new ones cannot pick it',
      access: WRITER_ROLES,
      params: IdParam,
      response: CalibrationEnvelope,
      errors: [404, 409],
      handler: async ({ user, params }) => ({
        calibration: presentCalibration(await knex.transaction((trx) => retireCalibration({ trx, actor: user, id: params.id }))),
      }),
    }),
  ];
}
