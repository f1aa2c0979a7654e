import type { Knex } from 'knex';
import type { Role } from '../../shared/roles';
import type { UserStatus } from '../../shared/schemas/user';
import { hashPassword } from '../auth/passwords';
import { conflict, notFound } from '../errors';
import { UserModel } from '../models/user-model';

/** Creates an account directly (demo data, tests, first manager). Invitations go through `invite`. */
export async function createPerson(props: {
  /** A transaction, or the knex to use outside one. */
  trx?: Knex;
  email: string;
  displayName: string;
  role: Role;
  password?: string;
  passwordHash?: string;
  status?: UserStatus;
  invitedById?: number | null;
}): Promise<UserModel> {
  const passwordHash = props.passwordHash ?? (props.password ? await hashPassword(props.password) : null);
  return UserModel.query(props.trx).insertAndFetch({
    email: props.email.toLowerCase(),
    displayName: props.displayName,
    role: props.role,
    status: props.status ?? (passwordHash ? 'active' : 'invited'),
    passwordHash,
    invitedById: props.invitedById ?? null,
  });
}

/**
 * A manager changes someone's role or status. The lab must keep at least one active manager.
 * The active managers' rows are locked first, always in id order, so two managers demoting each
 * other at once queue up instead of deadlocking, and only one of them can win.
 */
export async function updatePerson(props: {
  trx: Knex.Transaction;
  id: number;
  role?: Role;
  status?: 'active' | 'deactivated';
}): Promise<UserModel> {
  const activeManagers = await UserModel.query(props.trx).modify('activeManagers').orderBy('id').forUpdate();
  const person = await UserModel.query(props.trx).findById(props.id).forUpdate();
  if (!person) throw notFound(`There is no person with id ${props.id}.`);
  if (props.status === 'active' && !person.passwordHash) {
    throw conflict('conflict', `${person.displayName} has not accepted the invitation yet; resend it instead.`);
  }
  const staysManager = (props.role ?? person.role) === 'manager' && (props.status ?? person.status) === 'active';
  const isActiveManager = person.role === 'manager' && person.status === 'active';
  if (isActiveManager && !staysManager && activeManagers.length <= 1) {
    throw conflict('last_manager', 'The lab needs at least one active lab manager. Make someone else a manager first.');
  }
  const patch: Partial<Pick<UserModel, 'role' | 'status'>> = {};
  if (props.role) patch.role = props.role;
  if (props.status) patch.status = props.status;
  const updated = await person.$query(props.trx).patchAndFetch(patch);
  // A deactivated person's sessions end now, so reactivating them later revives no old cookie.
  if (props.status === 'deactivated') await endSessionsOf(props.trx, person.id);
  return updated;
}

/** Deletes the stored sessions of one person, except `keepSessionId` when given. */
export async function endSessionsOf(knex: Knex, userId: number, keepSessionId?: string): Promise<void> {
  const query = knex('session').whereRaw("(sess -> 'passport' ->> 'user') = ?", [String(userId)]);
  if (keepSessionId) query.whereNot('sid', keepSessionId);
  await query.delete();
}
