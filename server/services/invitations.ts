import type { Knex } from 'knex';
import type { Role } from '../../shared/roles';
import { hashPassword } from '../auth/passwords';
import { conflict, notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { invitationMail } from '../mail/templates';
import { UserModel } from '../models/user-model';
import { findUsableLinkToken, issueLinkToken, spendLinkToken } from './link-tokens';
import { createPerson } from './people';

export interface InvitationSettings {
  mailer: Mailer;
  publicBaseUrl: string;
  ttlHours: number;
}

async function sendInvitation(trx: Knex.Transaction, person: UserModel, inviter: UserModel, settings: InvitationSettings) {
  const token = await issueLinkToken({ trx, userId: person.id, purpose: 'invitation', ttlMs: settings.ttlHours * 3_600_000 });
  // Sent inside the transaction: if the mail server refuses, the invitation is not kept either.
  await settings.mailer.send(
    invitationMail({
      to: person.email,
      displayName: person.displayName,
      role: person.role,
      invitedBy: inviter.displayName,
      link: `${settings.publicBaseUrl}/accept-invite?token=${token}`,
      ttlHours: settings.ttlHours,
    }),
  );
}

export async function invitePerson(props: {
  trx: Knex.Transaction;
  inviter: UserModel;
  email: string;
  displayName: string;
  role: Role;
  settings: InvitationSettings;
}): Promise<UserModel> {
  const existing = await UserModel.query(props.trx).findOne({ email: props.email });
  if (existing) {
    throw conflict('email_taken', `${props.email} already has an account (${existing.status}). Change it on the People screen.`);
  }
  const person = await createPerson({
    trx: props.trx,
    email: props.email,
    displayName: props.displayName,
    role: props.role,
    invitedById: props.inviter.id,
  });
  await sendInvitation(props.trx, person, props.inviter, props.settings);
  return person;
}

export async function resendInvitation(props: {
  trx: Knex.Transaction;
  inviter: UserModel;
  personId: number;
  settings: InvitationSettings;
}): Promise<UserModel> {
  const person = await UserModel.query(props.trx).findById(props.personId);
  if (!person) throw notFound(`There is no person with id ${props.personId}.`);
  if (person.status !== 'invited') {
    throw conflict('conflict', `${person.displayName} has already accepted; they can use "forgot password" instead.`);
  }
  await sendInvitation(props.trx, person, props.inviter, props.settings);
  return person;
}

export async function previewInvitation(token: string): Promise<UserModel> {
  const link = await findUsableLinkToken({ token, purpose: 'invitation' });
  const person = await UserModel.query().findById(link.userId);
  if (!person) throw notFound('The invited account no longer exists.');
  return person;
}

/** Sets the password chosen through an invitation link and activates the account, once. */
export async function acceptInvitation(props: {
  trx: Knex.Transaction;
  token: string;
  displayName: string;
  password: string;
}): Promise<UserModel> {
  const link = await findUsableLinkToken({ trx: props.trx, token: props.token, purpose: 'invitation', lock: true });
  const person = await UserModel.query(props.trx).findById(link.userId).forUpdate();
  if (!person) throw notFound('The invited account no longer exists.');
  if (person.status === 'deactivated') throw conflict('conflict', 'This account was deactivated after the invitation was sent.');
  await spendLinkToken(props.trx, link);
  return person.$query(props.trx).patchAndFetch({
    displayName: props.displayName,
    passwordHash: await hashPassword(props.password),
    status: 'active',
  });
}
