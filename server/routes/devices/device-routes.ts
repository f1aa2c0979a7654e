import { WRITER_ROLES } from '../../../shared/roles';
import {
  DeviceMeasurementEnvelope,
  DeviceMeasurementList,
  LabSettingsEnvelope,
  LabSettingsUpdateInput,
  LensDesignEnvelope,
  MeasurementCreateInput,
} from '../../../shared/schemas/device';
import { IdParam } from '../../../shared/schemas/fields';
import { SampleCodeParam } from '../../../shared/schemas/sample';
import { ZonePlateDesignInput } from '../../../shared/schemas/zone-plate';
import type { AppContext } from '../../app-context';
import { notFound } from '../../errors';
import { route, type AnyRouteSpec } from '../../http/route';
import type { SampleModel } from '../../models/sample-model';
import { UserModel } from '../../models/user-model';
import {
  presentLabSettings,
  presentLensDesign,
  presentLensDesignVersion,
  presentMeasurement,
} from '../../presenters/device-presenter';
import { addMeasurement, deleteMeasurement, measurementsOf } from '../../services/device-measurements';
import { labMinFeatureNm, labSettingsRow, updateLabSettings } from '../../services/lab-settings';
import { currentDesignOf, designsOf, radiiCsvOf, saveLensDesign } from '../../services/lens-designs';
import { findSampleByCode } from '../../services/sample-lookup';

const TAG = 'Devices';
const MeasurementParams = SampleCodeParam.extend(IdParam.shape);

export function deviceRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex } = context;

  async function settingsEnvelope() {
    const row = await labSettingsRow(knex);
    const updatedBy = row?.updatedById ? ((await UserModel.query(knex).findById(row.updatedById)) ?? null) : null;
    return { settings: presentLabSettings(row, updatedBy) };
  }

  async function designEnvelope(device: SampleModel) {
    const [current, ...earlier] = await designsOf(knex, device.id);
    return {
      design: current ? presentLensDesign(current, device.code, await labMinFeatureNm(knex)) : null,
      earlier: earlier.map(presentLensDesignVersion),
    };
  }

  return [
    route({
      method: 'get',
      path: '/lab-settings',
      tag: TAG,
      summary: "The lab's settings: the smallest feature its lithography writes",
      access: 'signed-in',
      response: LabSettingsEnvelope,
      handler: settingsEnvelope,
    }),
    route({
      method: 'patch',
      path: '/lab-settings',
      tag: TAG,
      summary: "Change the lab's settings (lab managers); lens designs are warned against the new limit",
      access: ['manager'],
      body: LabSettingsUpdateInput,
      response: LabSettingsEnvelope,
      handler: async ({ user, body }) => {
        await knex.transaction((trx) => updateLabSettings({ trx, actor: user, minFeatureNm: body.minFeatureNm }));
        return settingsEnvelope();
      },
    }),
    route({
      method: 'get',
      path: '/samples/:code/lens-design',
      tag: TAG,
      summary: "A device's current zone-plate design (warnings against the lab's setting) and its earlier versions",
      access: 'signed-in',
      params: SampleCodeParam,
      response: LensDesignEnvelope,
      errors: [404],
      handler: async ({ params }) => designEnvelope(await findSampleByCode(params.code)),
    }),
    route({
      method: 'put',
      path: '/samples/:code/lens-design',
      tag: TAG,
      summary:
        "Save a new current zone-plate design for a device (the lab's lithography setting replaces minFeatureNm); attached to the lithography step that made it",
      access: WRITER_ROLES,
      params: SampleCodeParam,
      body: ZonePlateDesignInput,
      response: LensDesignEnvelope,
      errors: [404],
      handler: async ({ user, params, body }) => {
        const device = await knex.transaction(async (trx) => {
          const sample = await findSampleByCode(params.code, { trx, lock: true });
          await saveLensDesign({ trx, actor: user, device: sample, input: body });
          return sample;
        });
        return designEnvelope(device);
      },
    }),
    route({
      method: 'get',
      path: '/samples/:code/lens-design/radii.csv',
      tag: TAG,
      summary: 'The etched zones of the current design (exact radii) as CSV for the lithography pattern',
      access: 'signed-in',
      params: SampleCodeParam,
      producesType: 'text/csv',
      errors: [404],
      handler: async ({ params, res }) => {
        const device = await findSampleByCode(params.code);
        const design = await currentDesignOf(knex, device.id);
        if (!design) throw notFound(`${device.code} has no lens design yet.`);
        res.setHeader('Content-Type', 'text/csv; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="${device.code}-zone-radii.csv"`);
        res.send(radiiCsvOf(design));
      },
    }),
    route({
      method: 'get',
      path: '/samples/:code/measurements',
      tag: TAG,
      summary: "Measurements on a device, each with the current design's prediction beside it",
      access: 'signed-in',
      params: SampleCodeParam,
      response: DeviceMeasurementList,
      errors: [404],
      handler: async ({ params }) => {
        const device = await findSampleByCode(params.code);
        const design = (await currentDesignOf(knex, device.id))?.summary ?? null;
        const measurements = await measurementsOf(knex, device.id);
        return { measurements: measurements.map((entry) => presentMeasurement(entry, device.code, design)) };
      },
    }),
    route({
      method: 'post',
      path: '/samples/:code/measurements',
      tag: TAG,
      summary: 'Record a measurement on a device (focal length against wavelength or gate voltage, efficiency)',
      access: WRITER_ROLES,
      params: SampleCodeParam,
      body: MeasurementCreateInput,
      response: DeviceMeasurementEnvelope,
      successStatus: 201,
      errors: [404],
      handler: async ({ user, params, body }) => {
        const { device, measurement } = await knex.transaction(async (trx) => {
          const sample = await findSampleByCode(params.code, { trx });
          return { device: sample, measurement: await addMeasurement({ trx, actor: user, device: sample, input: body }) };
        });
        const design = (await currentDesignOf(knex, device.id))?.summary ?? null;
        return { measurement: presentMeasurement(measurement, device.code, design) };
      },
    }),
    route({
      method: 'delete',
      path: '/samples/:code/measurements/:id',
      tag: TAG,
      summary: 'Remove a measurement from a device; its rows are kept in the history',
      access: WRITER_ROLES,
      params: MeasurementParams,
      errors: [404],
      handler: async ({ user, params }) => {
        await knex.transaction(async (trx) => {
          const device = await findSampleByCode(params.code, { trx });
          await deleteMeasurement({ trx, actor: user, device, measurementId: params.id });
        });
      },
    }),
  ];
}
