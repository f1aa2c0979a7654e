import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import { linkExpired, linkInvalid, linkUsed } from '../errors';
import { LinkTokenModel, type LinkPurpose } from '../models/link-token-model';

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** Issues a one-time link token, revoking the person's earlier unused ones for the same purpose. */
export async function issueLinkToken(props: {
  trx: Knex.Transaction;
  userId: number;
  purpose: LinkPurpose;
  ttlMs: number;
}): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await LinkTokenModel.query(props.trx)
    .patch({ revokedAt: new Date() })
    .where({ userId: props.userId, purpose: props.purpose })
    .whereNull('usedAt')
    .whereNull('revokedAt');
  await LinkTokenModel.query(props.trx).insert({
    userId: props.userId,
    purpose: props.purpose,
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + props.ttlMs),
  });
  return token;
}

/**
 * Finds a usable token or says precisely why it is not usable. With `lock`, the row is held
 * until the transaction ends so two tabs cannot both spend the same link.
 */
export async function findUsableLinkToken(props: {
  trx?: Knex.Transaction;
  token: string;
  purpose: LinkPurpose;
  lock?: boolean;
}): Promise<LinkTokenModel> {
  const query = LinkTokenModel.query(props.trx).findOne({ tokenHash: hashToken(props.token), purpose: props.purpose });
  const link = await (props.lock ? query.forUpdate() : query);
  if (!link) throw linkInvalid();
  if (link.usedAt) throw linkUsed();
  if (link.revokedAt) throw linkExpired();
  if (link.expiresAt.getTime() <= Date.now()) throw linkExpired();
  return link;
}

export async function spendLinkToken(trx: Knex.Transaction, link: LinkTokenModel): Promise<void> {
  await LinkTokenModel.query(trx).findById(link.id).patch({ usedAt: new Date() });
}
