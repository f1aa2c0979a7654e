import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { IdParam } from '../../../shared/schemas/fields';
import { SampleCodeParam } from '../../../shared/schemas/sample';
import {
  SharedAudit,
  ShareLinkCreated,
  ShareLinkCreateInput,
  ShareLinkEnvelope,
  ShareLinkList,
  ShareTokenParam,
} from '../../../shared/schemas/share-link';
import type { AppContext } from '../../app-context';
import { notFound, tooManyAttempts } from '../../errors';
import { route, type AnyRouteSpec } from '../../http/route';
import { SampleModel } from '../../models/sample-model';
import type { UserModel } from '../../models/user-model';
import { presentAudit } from '../../presenters/audit-presenter';
import { presentShareLink } from '../../presenters/share-link-presenter';
import { auditOf } from '../../services/audit';
import { sendAuditJsonLd, sendAuditPdf } from '../../services/audit/send';
import { findSampleByCode } from '../../services/sample-lookup';
import { createShareLink, openShareLink, revokeShareLink, shareLinksOf } from '../../services/share-links';

const TAG = 'Share links';
/**
 * Openings of shared audits per address: a reviewer reads an audit a few times; many requests
 * a minute are someone guessing tokens or a runaway script (common practice, no source).
 */
const SHARED_OPENINGS_PER_MINUTE = 30;

function sharedLimiter(): RequestHandler {
  return rateLimit({
    windowMs: 60_000,
    limit: SHARED_OPENINGS_PER_MINUTE,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? 'unknown'),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(tooManyAttempts('Too many requests for shared audits from this address. Wait a minute.')),
  });
}

export function shareLinkRoutes(context: AppContext): AnyRouteSpec[] {
  const { knex, files, config } = context;
  const limiter = sharedLimiter();
  const urlFor = (token: string) => `${config.publicBaseUrl}/shared/${token}`;

  /** Opens the link (logging it) and audits the record it shares. */
  async function open(token: string, format: 'json' | 'pdf' | 'jsonld', viewer: UserModel | undefined) {
    const { link, sample } = await knex.transaction((trx) => openShareLink({ trx, token, format, viewerId: viewer?.id ?? null }));
    return { link, sample, ...(await auditOf({ knex, files, sample })) };
  }

  return [
    route({
      method: 'post',
      path: '/samples/:code/share-links',
      tag: TAG,
      summary:
        "Issue an expiring read-only link to a record's audit for an outside reviewer (lab managers); the token is shown once",
      access: ['manager'],
      params: SampleCodeParam,
      body: ShareLinkCreateInput,
      response: ShareLinkCreated,
      successStatus: 201,
      errors: [404],
      handler: async ({ user, params, body }) => {
        const { sample, link, token } = await knex.transaction(async (trx) => {
          const found = await findSampleByCode(params.code, { trx });
          return {
            sample: found,
            ...(await createShareLink({ trx, actor: user, sample: found, expiresInDays: body.expiresInDays })),
          };
        });
        const withPeople = await link.$query(knex).withGraphFetched('[createdBy, revokedBy]');
        return { shareLink: presentShareLink(withPeople, sample.code), token, url: urlFor(token) };
      },
    }),
    route({
      method: 'get',
      path: '/samples/:code/share-links',
      tag: TAG,
      summary: "The share links issued for a record's audit, newest first, with their openings (lab managers)",
      access: ['manager'],
      params: SampleCodeParam,
      response: ShareLinkList,
      errors: [404],
      handler: async ({ params }) => {
        const sample = await findSampleByCode(params.code);
        return { shareLinks: (await shareLinksOf(knex, sample.id)).map((link) => presentShareLink(link, sample.code)) };
      },
    }),
    route({
      method: 'post',
      path: '/share-links/:id/revoke',
      tag: TAG,
      summary: 'Withdraw a share link at once (lab managers); revoking twice changes nothing',
      access: ['manager'],
      params: IdParam,
      response: ShareLinkEnvelope,
      errors: [404],
      handler: async ({ user, params }) => {
        const link = await knex.transaction((trx) => revokeShareLink({ trx, actor: user, id: params.id }));
        const sample = await SampleModel.query(knex).findById(link.sampleId);
        if (!sample) throw notFound(`The record of share link ${link.id} no longer exists.`);
        return { shareLink: presentShareLink(link, sample.code) };
      },
    }),
    route({
      method: 'get',
      path: '/shared/:token',
      tag: TAG,
      summary: 'The audit a share link opens, for anyone holding the link; each opening is logged (410 when expired or revoked)',
      access: 'public',
      before: [limiter],
      params: ShareTokenParam,
      response: SharedAudit,
      errors: [404, 410, 429],
      handler: async ({ params, user }) => {
        const { link, sample, audit, gaps } = await open(params.token, 'json', user);
        return { audit: presentAudit(audit, gaps), sampleCode: sample.code, expiresAt: link.expiresAt.toISOString() };
      },
    }),
    route({
      method: 'get',
      path: '/shared/:token/audit.pdf',
      tag: TAG,
      summary: 'The shared audit as a PDF; each opening is logged',
      access: 'public',
      before: [limiter],
      params: ShareTokenParam,
      producesType: 'application/pdf',
      errors: [404, 410, 429],
      handler: async ({ params, user, res }) => sendAuditPdf(res, await open(params.token, 'pdf', user), files),
    }),
    route({
      method: 'get',
      path: '/shared/:token/audit.jsonld',
      tag: TAG,
      summary: 'The shared audit as W3C PROV-O JSON-LD; each opening is logged',
      access: 'public',
      before: [limiter],
      params: ShareTokenParam,
      producesType: 'application/ld+json',
      errors: [404, 410, 429],
      handler: async ({ params, user, res }) =>
        sendAuditJsonLd(res, await open(params.token, 'jsonld', user), config.publicBaseUrl),
    }),
  ];
}
