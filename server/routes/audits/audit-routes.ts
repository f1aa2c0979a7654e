import { AuditEnvelope } from '../../../shared/schemas/audit';
import { LineageGraph } from '../../../shared/schemas/lineage-graph';
import { SampleCodeParam } from '../../../shared/schemas/sample';
import type { AppContext } from '../../app-context';
import { route, type AnyRouteSpec } from '../../http/route';
import { presentAudit } from '../../presenters/audit-presenter';
import { auditOf } from '../../services/audit';
import { sendAuditJsonLd, sendAuditPdf } from '../../services/audit/send';
import { lineageGraphOf } from '../../services/lineage-graph';
import { findSampleByCode } from '../../services/sample-lookup';

const TAG = 'Audits';

export function auditRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex, files, config } = context;
  const audited = async (code: string) => auditOf({ knex, files, sample: await findSampleByCode(code) });

  return [
    route({
      method: 'get',
      path: '/samples/:code/lineage-graph',
      tag: TAG,
      summary: 'The record with all its ancestors and descendants (each once, by generation) and the links between them',
      access: 'signed-in',
      params: SampleCodeParam,
      response: LineageGraph,
      errors: [404],
      handler: async ({ params }) => lineageGraphOf(knex, await findSampleByCode(params.code)),
    }),
    route({
      method: 'get',
      path: '/samples/:code/audit',
      tag: TAG,
      summary: 'The publication audit of a record: ancestry, steps, evidence with files re-checked, chain check, readiness gaps',
      access: 'signed-in',
      params: SampleCodeParam,
      response: AuditEnvelope,
      errors: [404],
      handler: async ({ params }) => {
        const { audit, gaps } = await audited(params.code);
        return { audit: presentAudit(audit, gaps) };
      },
    }),
    route({
      method: 'get',
      path: '/samples/:code/audit.pdf',
      tag: TAG,
      summary: 'The audit as a PDF for people: verdict, ancestry by generation, steps, evidence with thumbnails, checks',
      access: 'signed-in',
      params: SampleCodeParam,
      producesType: 'application/pdf',
      errors: [404],
      handler: async ({ params, res }) => sendAuditPdf(res, await audited(params.code), files),
    }),
    route({
      method: 'get',
      path: '/samples/:code/audit.jsonld',
      tag: TAG,
      summary: 'The audit as W3C PROV-O JSON-LD, with the hashed text of its history events for offline checking',
      access: 'signed-in',
      params: SampleCodeParam,
      producesType: 'application/ld+json',
      errors: [404],
      handler: async ({ params, res }) => sendAuditJsonLd(res, await audited(params.code), config.publicBaseUrl),
    }),
  ];
}
