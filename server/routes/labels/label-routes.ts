import {
  LabelSheetQuery,
  LabelTemplateCreateInput,
  LabelTemplateEnvelope,
  LabelTemplateList,
  type LabelTemplate,
} from '../../../shared/schemas/labels';
import { SAMPLE_KIND_LABELS } from '../../../shared/samples';
import type { AppContext } from '../../app-context';
import { invalid, notFound } from '../../errors';
import { route, type AnyRouteSpec } from '../../http/route';
import { SampleModel } from '../../models/sample-model';
import { LabelTemplateModel } from '../../models/storage-models';
import { UserModel } from '../../models/user-model';
import { renderLabelSheet, type LabelContent } from '../../services/label-sheets';
import { canonicalSampleCode } from '../../services/sample-lookup';
import { findBoxByCode, listPlaces } from '../../services/storage';

const TAG = 'Labels';

const presentTemplate = (template: LabelTemplateModel): LabelTemplate => ({
  id: template.id,
  name: template.name,
  shape: template.shape,
  labelWidthMm: template.labelWidthMm,
  labelHeightMm: template.labelHeightMm,
  pageWidthMm: template.pageWidthMm,
  pageHeightMm: template.pageHeightMm,
  columns: template.columns,
  rows: template.rows,
  marginLeftMm: template.marginLeftMm,
  marginTopMm: template.marginTopMm,
  columnGapMm: template.columnGapMm,
  rowGapMm: template.rowGapMm,
  builtIn: template.builtIn,
});

const initials = (name: string) =>
  name
    .split(/\s+/)
    .filter(Boolean)
    .map((part) => part[0].toUpperCase())
    .join('')
    .slice(0, 3);

export function labelRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex, config } = context;
  const urlFor = (code: string) => `${config.publicBaseUrl}/s/${code}`;

  async function sampleLabels(codes: string[]): Promise<LabelContent[]> {
    const wanted = codes.map(canonicalSampleCode);
    const samples = await SampleModel.query(knex).whereIn('code', wanted);
    const byCode = new Map(samples.map((sample) => [sample.code, sample]));
    const missing = wanted.filter((code) => !byCode.has(code));
    if (missing.length) throw notFound(`No sample has the code ${missing.join(', ')}.`);
    const owners = new Map(
      (await UserModel.query(knex).whereIn('id', [...new Set(samples.map((s) => s.ownerId))])).map((u) => [u.id, u]),
    );
    return wanted.map((code) => {
      const sample = byCode.get(code) as SampleModel;
      return {
        code,
        url: urlFor(code),
        lines: [
          `${sample.material} · ${SAMPLE_KIND_LABELS[sample.kind]}`,
          `${sample.createdAt.toISOString().slice(0, 10)} · ${initials(owners.get(sample.ownerId)?.displayName ?? '')}`,
        ],
      };
    });
  }

  return [
    route({
      method: 'get',
      path: '/label-templates',
      tag: TAG,
      summary: 'Label sheets Flakeline can print on, sized in millimetres',
      access: 'signed-in',
      response: LabelTemplateList,
      handler: async () => ({ templates: (await LabelTemplateModel.query(knex).orderBy('name')).map(presentTemplate) }),
    }),
    route({
      method: 'post',
      path: '/label-templates',
      tag: TAG,
      summary: "Add a label sheet (lab managers); refused when the labels don't fit the page",
      access: ['manager'],
      body: LabelTemplateCreateInput,
      response: LabelTemplateEnvelope,
      successStatus: 201,
      errors: [409],
      handler: async ({ user, body }) => ({
        template: presentTemplate(
          await LabelTemplateModel.query(knex).insertAndFetch({ ...body, builtIn: false, createdById: user.id }),
        ),
      }),
    }),
    route({
      method: 'get',
      path: '/labels.pdf',
      tag: TAG,
      summary: 'A printable PDF of QR labels for samples, the outputs of a step, or a box',
      access: 'signed-in',
      query: LabelSheetQuery,
      producesType: 'application/pdf',
      errors: [404],
      handler: async ({ query, res }) => {
        const template = await LabelTemplateModel.query(knex).findById(query.template);
        if (!template) throw invalid({ 'query.template': [`There is no label template ${query.template}.`] });
        let labels: LabelContent[];
        if (query.samples) {
          labels = await sampleLabels(query.samples);
        } else if (query.step !== undefined) {
          const codes: string[] = await knex('step_samples as ss')
            .join('samples as s', 's.id', 'ss.sample_id')
            .where({ 'ss.step_id': query.step, 'ss.role': 'output' })
            .orderBy('ss.position')
            .pluck('s.code');
          if (!codes.length) throw notFound(`Step ${query.step} does not exist or made no samples.`);
          labels = await sampleLabels(codes);
        } else {
          const box = await findBoxByCode(knex, query.box ?? '');
          const place = (await listPlaces(knex)).find((entry) => entry.id === box.placeId);
          labels = [
            { code: box.code, url: urlFor(box.code), lines: [box.name, place?.path ?? '', `${box.rows} × ${box.columns} slots`] },
          ];
        }
        const pdf = await renderLabelSheet(presentTemplate(template), labels, query.skip);
        res.setHeader('Content-Type', 'application/pdf');
        res.setHeader('Content-Disposition', `inline; filename="flakeline-labels.pdf"`);
        res.send(pdf);
      },
    }),
  ];
}
