import type { Knex } from 'knex';
import { hashPassword } from '../auth/passwords';
import { notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { passwordResetMail } from '../mail/templates';
import { UserModel } from '../models/user-model';
import { findUsableLinkToken, issueLinkToken, spendLinkToken } from './link-tokens';

/**
 * Sends a reset link when the address belongs to an active account. The caller answers the
 * same either way, so the form cannot be used to learn who has an account.
 */
export async function requestPasswordReset(props: {
  trx: Knex.Transaction;
  email: string;
  mailer: Mailer;
  publicBaseUrl: string;
  ttlMinutes: number;
}): Promise<void> {
  const person = await UserModel.query(props.trx).findOne({ email: props.email });
  if (!person || person.status !== 'active') return;
  const token = await issueLinkToken({
    trx: props.trx,
    userId: person.id,
    purpose: 'password_reset',
    ttlMs: props.ttlMinutes * 60_000,
  });
  await props.mailer.send(
    passwordResetMail({
      to: person.email,
      displayName: person.displayName,
      link: `${props.publicBaseUrl}/reset-password?token=${token}`,
      ttlMinutes: props.ttlMinutes,
    }),
  );
}

export async function resetPassword(props: { trx: Knex.Transaction; token: string; password: string }): Promise<UserModel> {
  const link = await findUsableLinkToken({ trx: props.trx, token: props.token, purpose: 'password_reset', lock: true });
  const person = await UserModel.query(props.trx).findById(link.userId);
  if (!person) throw notFound('The account no longer exists.');
  await spendLinkToken(props.trx, link);
  return person.$query(props.trx).patchAndFetch({ passwordHash: await hashPassword(props.password) });
}
