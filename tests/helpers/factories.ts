import type { Knex } from 'knex';
import type { Role } from '../../shared/roles';
import type { UserStatus } from '../../shared/schemas/user';
import { hashPassword } from '../../server/auth/passwords';
import { createPerson } from '../../server/services/people';

export const TEST_PASSWORD = 'correct horse battery';

// Hashing is deliberately slow; one hash of the test password serves every factory-made person.
let testPasswordHash: Promise<string> | undefined;

let sequence = 0;

/** A person in the test database, active with TEST_PASSWORD unless told otherwise. */
export async function buildPerson(
  knex: Knex,
  overrides: { email?: string; displayName?: string; role?: Role; status?: UserStatus } = {},
) {
  sequence += 1;
  testPasswordHash ??= hashPassword(TEST_PASSWORD);
  const status = overrides.status ?? 'active';
  return createPerson({
    trx: knex,
    email: overrides.email ?? `person${sequence}@lab.flakeline.test`,
    displayName: overrides.displayName ?? `Test Person ${sequence}`,
    role: overrides.role ?? 'researcher',
    status,
    passwordHash: status === 'invited' ? undefined : await testPasswordHash,
  });
}

export const buildManager = (knex: Knex) => buildPerson(knex, { role: 'manager' });
