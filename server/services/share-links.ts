import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import { notFound, shareLinkExpired, shareLinkRevoked } from '../errors';
import { SampleModel } from '../models/sample-model';
import { ShareLinkModel } from '../models/share-link-model';
import type { UserModel } from '../models/user-model';
import { appendHistory } from './history-chain';

const DAY_MS = 86_400_000;

/** Tokens are looked up by their SHA-256; the token itself exists only in the link handed out. */
export const tokenSha256 = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

export async function createShareLink(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  sample: SampleModel;
  expiresInDays: number;
}): Promise<{ link: ShareLinkModel; token: string }> {
  const { trx, actor, sample } = props;
  // 32 random bytes (256 bits): not guessable, so the link alone is the permission to read.
  const token = randomBytes(32).toString('base64url');
  const createdAt = new Date();
  const link = await ShareLinkModel.query(trx).insertAndFetch({
    sampleId: sample.id,
    tokenSha256: tokenSha256(token),
    createdById: actor.id,
    createdAt,
    expiresAt: new Date(createdAt.getTime() + props.expiresInDays * DAY_MS),
  });
  await appendHistory(trx, [
    {
      type: 'share_link.created',
      actorId: actor.id,
      subjectCode: sample.code,
      payload: { linkId: link.id, expiresAt: link.expiresAt.toISOString() },
    },
  ]);
  return { link, token };
}

export async function shareLinksOf(knex: Knex, sampleId: number): Promise<ShareLinkModel[]> {
  return ShareLinkModel.query(knex).where('sampleId', sampleId).withGraphFetched('[createdBy, revokedBy]').orderBy('id', 'desc');
}

/** Withdraws a link; revoking one already revoked changes nothing. */
export async function revokeShareLink(props: { trx: Knex.Transaction; actor: UserModel; id: number }): Promise<ShareLinkModel> {
  const { trx, actor, id } = props;
  const link = await ShareLinkModel.query(trx).findById(id).forUpdate();
  if (!link) throw notFound(`There is no share link ${id}.`);
  if (!link.revokedAt) {
    await link.$query(trx).patch({ revokedAt: new Date(), revokedById: actor.id });
    const sample = await SampleModel.query(trx).findById(link.sampleId);
    await appendHistory(trx, [
      { type: 'share_link.revoked', actorId: actor.id, subjectCode: sample?.code ?? null, payload: { linkId: link.id } },
    ]);
  }
  return link.$query(trx).withGraphFetched('[createdBy, revokedBy]');
}

/**
 * Opens a link for an outside reader: the record it shares, after counting the opening and
 * writing it to the history (by link id; the token never goes into the log).
 */
export async function openShareLink(props: {
  trx: Knex.Transaction;
  token: string;
  format: 'json' | 'pdf' | 'jsonld';
  viewerId: number | null;
}): Promise<{ link: ShareLinkModel; sample: SampleModel }> {
  const { trx, token } = props;
  const link = await ShareLinkModel.query(trx)
    .findOne({ tokenSha256: tokenSha256(token) })
    .forUpdate();
  if (!link) throw notFound('This shared audit link is not valid. Check that it was copied whole.');
  if (link.revokedAt) throw shareLinkRevoked();
  if (link.expiresAt.getTime() <= Date.now()) throw shareLinkExpired();
  const sample = await SampleModel.query(trx).findById(link.sampleId).throwIfNotFound();
  await link.$query(trx).patch({ openCount: link.openCount + 1, lastOpenedAt: new Date() });
  await appendHistory(trx, [
    {
      type: 'share_link.opened',
      actorId: props.viewerId,
      subjectCode: sample.code,
      payload: { linkId: link.id, format: props.format },
    },
  ]);
  return { link: await link.$query(trx), sample };
}
