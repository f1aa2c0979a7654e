import type { Knex } from 'knex';
import { createKnex, migrateToLatest } from './knex';

/**
 * What the application's role may do: read and write rows, use sequences; never change or remove
 * history events, never touch the migration bookkeeping. Re-applied after every migration (and
 * after a restore, which drops grants).
 */
export async function applyGrants(owner: Knex, appRole: string): Promise<void> {
  const role = `"${appRole.replace(/"/g, '""')}"`;
  await owner.raw(`grant usage on schema public to ${role}`);
  await owner.raw(`grant select, insert, update, delete on all tables in schema public to ${role}`);
  await owner.raw(`grant usage, select on all sequences in schema public to ${role}`);
  await owner.raw(`revoke update, delete, truncate on history_events from ${role}`);
  await owner.raw(`revoke all on knex_migrations, knex_migrations_lock from ${role}`);
}

/** Migrates as the owner and grants the app role its rights; returns the migrations applied. */
export async function prepareDatabase(props: { ownerUrl: string; appRole: string }): Promise<string[]> {
  const owner = createKnex(props.ownerUrl, 2);
  try {
    const applied = await migrateToLatest(owner);
    await applyGrants(owner, props.appRole);
    return applied;
  } finally {
    await owner.destroy();
  }
}
