import { WRITER_ROLES } from '../../../shared/roles';
import {
  CandidateFlakeResult,
  CandidateParam,
  ContrastInput,
  EvidenceEnvelope,
  EvidenceItems,
  type EvidenceKind,
  EvidenceList,
  EvidenceUpdateInput,
  EvidenceUploadFields,
} from '../../../shared/schemas/evidence';
import { IdParam } from '../../../shared/schemas/fields';
import { SampleCodeParam } from '../../../shared/schemas/sample';
import type { AppContext } from '../../app-context';
import { notFound } from '../../errors';
import { evidenceUpload } from '../../http/evidence-upload';
import { route, type AnyRouteSpec } from '../../http/route';
import { EvidenceModel } from '../../models/evidence-models';
import { StepModel } from '../../models/step-model';
import type { UserModel } from '../../models/user-model';
import { presentEvidence, presentEvidenceList } from '../../presenters/evidence-presenter';
import { presentSample } from '../../presenters/sample-presenter';
import { presentStep } from '../../presenters/step-presenter';
import { makeFlakeFromCandidate } from '../../services/candidate-flakes';
import { editEvidenceMetadata, measureContrast, rerunCandidates, uploadEvidence } from '../../services/evidence-changes';
import { findEvidence, layerCallOf } from '../../services/evidence-records';
import { findSampleByCode } from '../../services/sample-lookup';

const TAG = 'Evidence';
const UPLOAD_SUMMARY =
  'multipart/form-data: `file` (JPEG/PNG/TIFF micrograph, or a two-column text spectrum or AFM profile), `kind` and ' +
  '`metadata` (JSON). The type is read from the content; the file is analysed, stored by SHA-256 and thumbnailed.';

export function evidenceRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex, files } = context;
  // Both upload routes differ only in what the evidence is attached to.
  const attach = async (
    actor: UserModel,
    target: { sampleCode: string } | { stepId: number },
    body: { kind: EvidenceKind; metadata: string },
    file: Express.Multer.File | undefined,
  ) => {
    const evidence = await uploadEvidence({
      knex,
      files,
      actor,
      target,
      kind: body.kind,
      metadataJson: body.metadata,
      file: file as Express.Multer.File,
    });
    return { evidence: await presentEvidence(knex, evidence) };
  };
  return [
    route({
      method: 'post',
      path: '/samples/:code/evidence',
      tag: TAG,
      summary: `Attach thickness evidence to a sample. ${UPLOAD_SUMMARY}`,
      access: WRITER_ROLES,
      before: evidenceUpload,
      bodyType: 'multipart/form-data',
      params: SampleCodeParam,
      body: EvidenceUploadFields,
      response: EvidenceEnvelope,
      successStatus: 201,
      errors: [404, 409, 413, 415],
      handler: ({ user, params, body, req }) => attach(user, { sampleCode: params.code }, body, req.file),
    }),
    route({
      method: 'post',
      path: '/steps/:id/evidence',
      tag: TAG,
      summary: `Attach evidence to a step (e.g. a micrograph of a transfer). ${UPLOAD_SUMMARY}`,
      access: WRITER_ROLES,
      before: evidenceUpload,
      bodyType: 'multipart/form-data',
      params: IdParam,
      body: EvidenceUploadFields,
      response: EvidenceEnvelope,
      successStatus: 201,
      errors: [404, 409, 413, 415],
      handler: ({ user, params, body, req }) => attach(user, { stepId: params.id }, body, req.file),
    }),
    route({
      method: 'get',
      path: '/samples/:code/evidence',
      tag: TAG,
      summary: "A sample's evidence, newest first, and the combined layer call it adds up to (disagreements in plain words)",
      access: 'signed-in',
      params: SampleCodeParam,
      response: EvidenceList,
      errors: [404],
      handler: async ({ params }) => {
        const sample = await findSampleByCode(params.code);
        const items = await EvidenceModel.query(knex).where('sampleId', sample.id).orderBy('id', 'desc');
        return { evidence: await presentEvidenceList(knex, items), layerCall: await layerCallOf(knex, sample.id) };
      },
    }),
    route({
      method: 'get',
      path: '/steps/:id/evidence',
      tag: TAG,
      summary: "A step's evidence, newest first",
      access: 'signed-in',
      params: IdParam,
      response: EvidenceItems,
      errors: [404],
      handler: async ({ params }) => {
        if (!(await StepModel.query(knex).findById(params.id))) throw notFound(`There is no step with id ${params.id}.`);
        const items = await EvidenceModel.query(knex).where('stepId', params.id).orderBy('id', 'desc');
        return { evidence: await presentEvidenceList(knex, items) };
      },
    }),
    route({
      method: 'get',
      path: '/evidence/:id',
      tag: TAG,
      summary: 'One piece of evidence with its file, metadata, analysis and layer estimate',
      access: 'signed-in',
      params: IdParam,
      response: EvidenceEnvelope,
      errors: [404],
      handler: async ({ params }) => ({ evidence: await presentEvidence(knex, await findEvidence(knex, params.id)) }),
    }),
    route({
      method: 'patch',
      path: '/evidence/:id',
      tag: TAG,
      summary:
        'Replace the metadata from the version you read and analyse the file again; a stale version gets 409 with the current item',
      access: WRITER_ROLES,
      params: IdParam,
      body: EvidenceUpdateInput,
      response: EvidenceEnvelope,
      errors: [404, 409],
      handler: async ({ user, params, body }) => {
        const evidence = await editEvidenceMetadata({ knex, files, actor: user, id: params.id, ...body });
        return { evidence: await presentEvidence(knex, evidence) };
      },
    }),
    route({
      method: 'post',
      path: '/evidence/:id/contrast',
      tag: TAG,
      summary: 'Measure the contrast of a marked flake region against marked bare substrate and match it to 1–10 layers',
      access: WRITER_ROLES,
      params: IdParam,
      body: ContrastInput,
      response: EvidenceEnvelope,
      errors: [404, 409],
      handler: async ({ user, params, body }) => {
        const evidence = await measureContrast({ knex, files, actor: user, id: params.id, input: body });
        return { evidence: await presentEvidence(knex, evidence) };
      },
    }),
    route({
      method: 'post',
      path: '/evidence/:id/candidates',
      tag: TAG,
      summary: "Run the monolayer candidate finder again on a chip's micrograph",
      access: WRITER_ROLES,
      params: IdParam,
      response: EvidenceEnvelope,
      errors: [404, 409],
      handler: async ({ user, params }) => {
        const evidence = await rerunCandidates({ knex, files, actor: user, id: params.id });
        return { evidence: await presentEvidence(knex, evidence) };
      },
    }),
    route({
      method: 'post',
      path: '/evidence/:id/candidates/:index/flake',
      tag: TAG,
      summary:
        'Make a flake from a candidate: a flake search step from the chip, the new flake, and the micrograph attached to it',
      access: WRITER_ROLES,
      params: CandidateParam,
      response: CandidateFlakeResult,
      successStatus: 201,
      errors: [404, 409],
      handler: async ({ user, params }) => {
        const made = await knex.transaction((trx) =>
          makeFlakeFromCandidate({ trx, actor: user, evidenceId: params.id, index: params.index }),
        );
        return {
          sample: await presentSample(knex, made.flake),
          step: await presentStep(knex, made.step),
          evidence: await presentEvidence(knex, made.evidence),
        };
      },
    }),
  ];
}
