import type { Knex } from 'knex';
import { hashPassword } from '../server/auth/passwords';
import type { UserModel } from '../server/models/user-model';
import type { FileStore } from '../server/files/file-store';
import { createPerson } from '../server/services/people';
import { seedDemoEvidence } from './demo-evidence';
import { seedDemoSamples } from './demo-samples';

/**
 * The demo lab: an invented low-dimensional materials group. Every name here is made up.
 * The three sign-in accounts are listed in README.md.
 */
export const DEMO_PASSWORD = 'flakeline-demo';

export const DEMO_PEOPLE = [
  { email: 'manager@demo.flakeline.test', displayName: 'Maren Ostrova', role: 'manager', status: 'active' },
  { email: 'researcher@demo.flakeline.test', displayName: 'Teo Valcourt', role: 'researcher', status: 'active' },
  { email: 'reviewer@demo.flakeline.test', displayName: 'Priya Castellane', role: 'reviewer', status: 'active' },
  { email: 'ilkka.brandvold@demo.flakeline.test', displayName: 'Ilkka Brandvold', role: 'researcher', status: 'deactivated' },
] as const;

/** Loads the demo lab; its evidence files go to `files`, the store the server will read them from. */
export async function seedDemoLab(knex: Knex, files: FileStore): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await knex.transaction(async (trx) => {
    const people: UserModel[] = [];
    for (const person of DEMO_PEOPLE) {
      people.push(await createPerson({ trx, ...person, passwordHash, invitedById: people[0]?.id ?? null }));
    }
    const [manager, researcher] = people;
    // Someone invited who has not chosen a password yet, so the People screen shows that state.
    await createPerson({
      trx,
      email: 'noor.halvorsen@demo.flakeline.test',
      displayName: 'Noor Halvorsen',
      role: 'researcher',
      invitedById: manager.id,
    });
    await seedDemoSamples(trx, { manager, researcher });
  });
  // After the records commit: evidence goes through the upload service, which opens its own transaction.
  await seedDemoEvidence(knex, files, DEMO_PEOPLE[1].email);
}

/** True when the database has no people yet, i.e. this is the first start. */
export async function isEmptyLab(knex: Knex): Promise<boolean> {
  const row = await knex('users').count<{ count: string }[]>({ count: '*' }).first();
  return Number(row?.count ?? 0) === 0;
}
