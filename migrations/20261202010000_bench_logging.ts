import type { Knex } from 'knex';

const STEP_TYPES_SQL =
  "('exfoliation', 'cvd_growth', 'transfer', 'stacking', 'lithography', 'etching', 'annealing', 'encapsulation', 'metal_deposition', 'cleaving')";

/**
 * Logging at the bench: idempotency keys of step submissions (a resent or double-tapped step is
 * logged once), personal step templates, and precursor lots as a sample kind.
 */
export async function up(knex: Knex): Promise<void> {
  // One row per (person, key): the primary key is what makes a replay find the first step.
  await knex.schema.createTable('step_submissions', (table) => {
    table.bigInteger('user_id').notNullable().references('users.id').onDelete('CASCADE');
    table.text('idempotency_key').notNullable();
    // SHA-256 (hex) of the parsed request body, to tell a replay from a reused key.
    table.text('request_sha256').notNullable();
    table.bigInteger('step_id').notNullable().references('steps.id').onDelete('RESTRICT').index();
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.primary(['user_id', 'idempotency_key']);
    table.check("idempotency_key ~ '^[A-Za-z0-9_-]{8,100}$'", [], 'step_submissions_key_format');
    table.check("request_sha256 ~ '^[0-9a-f]{64}$'", [], 'step_submissions_sha256_hex');
  });

  await knex.schema.createTable('step_templates', (table) => {
    table.bigIncrements('id');
    table.bigInteger('user_id').notNullable().references('users.id').onDelete('CASCADE');
    table.text('name').notNullable();
    table.text('type').notNullable();
    table.jsonb('body').notNullable();
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check(`type in ${STEP_TYPES_SQL}`, [], 'step_templates_type_known');
    table.check('length(trim(name)) between 1 and 80', [], 'step_templates_name_length');
  });
  await knex.raw('create unique index step_templates_user_name_unique on step_templates (user_id, lower(name))');

  // The "repeat my last run" list reads steps by person, newest first.
  await knex.schema.alterTable('steps', (table) => {
    table.index(['created_by_id', 'created_at']);
    table.index(['operator_id', 'created_at']);
  });

  await knex.raw('alter table samples drop constraint samples_kind_known');
  await knex.raw(
    "alter table samples add constraint samples_kind_known check (kind in ('crystal', 'chip', 'flake', 'film', 'stack', 'device', 'precursor'))",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('alter table samples drop constraint samples_kind_known');
  await knex.raw(
    "alter table samples add constraint samples_kind_known check (kind in ('crystal', 'chip', 'flake', 'film', 'stack', 'device'))",
  );
  await knex.schema.alterTable('steps', (table) => {
    table.dropIndex(['created_by_id', 'created_at']);
    table.dropIndex(['operator_id', 'created_at']);
  });
  await knex.schema.dropTable('step_templates');
  await knex.schema.dropTable('step_submissions');
}
