import type { Knex } from 'knex';

/**
 * Samples (things), steps (what people did to them), the parent → child links that steps make,
 * and the append-only, hash-chained history of every change.
 */
export async function up(knex: Knex): Promise<void> {
  // Trigram indexes make "contains" search over codes, names and notes fast; pg_trgm is a trusted
  // extension, so the database owner may create it.
  await knex.raw('create extension if not exists pg_trgm');

  await knex.schema.createTable('samples', (table) => {
    table.bigIncrements('id');
    table.text('code').notNullable().unique();
    table.text('kind').notNullable();
    table.text('material').notNullable();
    table.text('name');
    table.text('status').notNullable().defaultTo('ready');
    table.bigInteger('owner_id').notNullable().references('users.id').onDelete('RESTRICT');
    table.text('note');
    table.jsonb('properties').notNullable().defaultTo('{}');
    table.double('layer_estimate');
    table.integer('version').notNullable().defaultTo(1);
    table.text('retired_reason');
    table.bigInteger('created_by_id').references('users.id').onDelete('SET NULL');
    table.timestamps(true, true);
    table.check("kind in ('crystal', 'chip', 'flake', 'film', 'stack', 'device')", [], 'samples_kind_known');
    table.check("status in ('ready', 'in_process', 'used_up', 'missing', 'discarded', 'retired')", [], 'samples_status_known');
    table.check("(status = 'retired') = (retired_reason is not null)", [], 'samples_retired_with_reason');
    table.check('version >= 1', [], 'samples_version_positive');
    table.index(['kind', 'created_at']);
    table.index(['status', 'created_at']);
    table.index(['owner_id', 'created_at']);
    table.index(['created_at']);
    table.index(['layer_estimate']);
  });
  await knex.raw('create index samples_material_lower_idx on samples (lower(material))');
  await knex.raw(
    "create index samples_search_idx on samples using gin ((code || ' ' || coalesce(name, '') || ' ' || coalesce(note, '')) gin_trgm_ops)",
  );

  await knex.schema.createTable('steps', (table) => {
    table.bigIncrements('id');
    table.text('type').notNullable();
    table.bigInteger('operator_id').references('users.id').onDelete('SET NULL').index();
    table.timestamp('started_at', { useTz: true });
    table.timestamp('ended_at', { useTz: true });
    table.text('instrument');
    table.jsonb('parameters').notNullable().defaultTo('{}');
    table.text('notes');
    table.bigInteger('created_by_id').references('users.id').onDelete('SET NULL');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check(
      "type in ('exfoliation', 'cvd_growth', 'transfer', 'stacking', 'lithography', 'etching', 'annealing', 'encapsulation', 'metal_deposition', 'cleaving')",
      [],
      'steps_type_known',
    );
    table.check('ended_at is null or started_at is null or ended_at >= started_at', [], 'steps_end_after_start');
    table.index(['started_at']);
  });

  // How each sample took part in a step: used as input, treated in place, or made by it.
  await knex.schema.createTable('step_samples', (table) => {
    table.bigInteger('step_id').notNullable().references('steps.id').onDelete('RESTRICT');
    table.bigInteger('sample_id').notNullable().references('samples.id').onDelete('RESTRICT');
    table.text('role').notNullable();
    table.integer('position').notNullable().defaultTo(0);
    table.boolean('consumed').notNullable().defaultTo(false);
    table.primary(['step_id', 'sample_id', 'role']);
    table.index(['sample_id']);
    table.check("role in ('input', 'treated', 'output')", [], 'step_samples_role_known');
  });

  // Parent → child edges, one per input × output of a step; the recursive lineage queries walk these.
  await knex.schema.createTable('lineage_links', (table) => {
    table.bigInteger('parent_id').notNullable().references('samples.id').onDelete('RESTRICT');
    table.bigInteger('child_id').notNullable().references('samples.id').onDelete('RESTRICT');
    table.bigInteger('step_id').notNullable().references('steps.id').onDelete('RESTRICT');
    table.primary(['child_id', 'parent_id', 'step_id']);
    table.index(['parent_id', 'child_id']);
    table.check('parent_id <> child_id', [], 'lineage_links_not_self');
  });

  await knex.schema.createTable('history_events', (table) => {
    // Ids are taken explicitly inside the chain lock, so they follow chain order.
    table.bigInteger('id').primary();
    table.timestamp('occurred_at', { useTz: true }).notNullable();
    table.bigInteger('actor_id').references('users.id').onDelete('RESTRICT');
    table.text('type').notNullable();
    table.text('subject_code');
    table.bigInteger('step_id').references('steps.id').onDelete('RESTRICT');
    table.jsonb('payload').notNullable();
    // The exact JSON text that was hashed; the columns above are its queryable copy.
    table.text('body').notNullable();
    table.text('prev_hash').notNullable();
    table.text('hash').notNullable().unique();
    table.index(['subject_code', 'id']);
    table.index(['step_id']);
  });
  await knex.raw('create sequence history_events_id_seq owned by history_events.id');

  // The history is append-only for everyone who is not a superuser: the table owner (the app's
  // role) cannot change or remove an event either, and cannot disable this without owning it as
  // superuser would. A superuser can still alter rows; the hash chain makes that visible.
  await knex.raw(`
    create function history_events_refuse_change() returns trigger language plpgsql as $$
    begin
      raise exception 'history_events is append-only: % refused', tg_op using errcode = 'insufficient_privilege';
    end $$;
  `);
  await knex.raw(`
    create trigger history_events_no_update_delete before update or delete on history_events
      for each row execute function history_events_refuse_change();
    create trigger history_events_no_truncate before truncate on history_events
      for each statement execute function history_events_refuse_change();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('history_events');
  await knex.raw('drop function if exists history_events_refuse_change()');
  await knex.schema.dropTable('lineage_links');
  await knex.schema.dropTable('step_samples');
  await knex.schema.dropTable('steps');
  await knex.schema.dropTable('samples');
}
