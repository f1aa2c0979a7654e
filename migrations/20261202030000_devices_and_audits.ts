import type { Knex } from 'knex';

/**
 * Devices and audits: the lab's settings (what its lithography writes), zone-plate lens designs
 * kept with a device (every version), measurements on a device, and read-only share links to a
 * record's audit (only the token's SHA-256 is kept). history_events is untouched: still append-only.
 */
export async function up(knex: Knex): Promise<void> {
  // One row at most (id = 1); no row means Flakeline's defaults.
  await knex.schema.createTable('lab_settings', (table) => {
    table.integer('id').primary();
    table.double('min_feature_nm').notNullable();
    table.bigInteger('updated_by_id').references('users.id').onDelete('SET NULL');
    table.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check('id = 1', [], 'lab_settings_single_row');
    table.check('min_feature_nm > 0 and min_feature_nm <= 100000', [], 'lab_settings_min_feature_range');
  });

  // Every saved design stays; the newest of a device is its current one.
  await knex.schema.createTable('lens_designs', (table) => {
    table.bigIncrements('id');
    table.bigInteger('device_id').notNullable().references('samples.id').onDelete('RESTRICT');
    table.bigInteger('step_id').references('steps.id').onDelete('RESTRICT');
    table.jsonb('input').notNullable();
    table.jsonb('summary').notNullable();
    table.bigInteger('created_by_id').notNullable().references('users.id').onDelete('RESTRICT');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("jsonb_typeof(input) = 'object'", [], 'lens_designs_input_object');
    table.check("summary ->> 'kind' = 'fresnel-zone-plate'", [], 'lens_designs_summary_kind');
    table.index(['device_id', 'id']);
    table.index(['step_id']);
  });

  await knex.schema.createTable('device_measurements', (table) => {
    table.bigIncrements('id');
    table.bigInteger('device_id').notNullable().references('samples.id').onDelete('RESTRICT');
    table.text('kind').notNullable();
    table.jsonb('rows').notNullable();
    table.text('instrument');
    table.text('note');
    table.timestamp('measured_at', { useTz: true }).notNullable();
    table.bigInteger('measured_by_id').notNullable().references('users.id').onDelete('RESTRICT');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check(
      "kind in ('focal_length_vs_wavelength', 'focal_length_vs_gate_voltage', 'efficiency_vs_gate_voltage')",
      [],
      'device_measurements_kind_known',
    );
    table.check(
      "jsonb_typeof(rows) = 'array' and jsonb_array_length(rows) between 1 and 500",
      [],
      'device_measurements_rows_array',
    );
    table.index(['device_id', 'measured_at']);
  });

  await knex.schema.createTable('share_links', (table) => {
    table.bigIncrements('id');
    table.bigInteger('sample_id').notNullable().references('samples.id').onDelete('RESTRICT');
    table.text('token_sha256').notNullable().unique();
    table.bigInteger('created_by_id').notNullable().references('users.id').onDelete('RESTRICT');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('expires_at', { useTz: true }).notNullable();
    table.timestamp('revoked_at', { useTz: true });
    table.bigInteger('revoked_by_id').references('users.id').onDelete('RESTRICT');
    table.integer('open_count').notNullable().defaultTo(0);
    table.timestamp('last_opened_at', { useTz: true });
    table.check("token_sha256 ~ '^[0-9a-f]{64}$'", [], 'share_links_token_sha256_hex');
    table.check('expires_at > created_at', [], 'share_links_expiry_after_creation');
    table.check('(revoked_at is null) = (revoked_by_id is null)', [], 'share_links_revoked_by_someone');
    table.check('open_count >= 0', [], 'share_links_open_count');
    table.index(['sample_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('share_links');
  await knex.schema.dropTable('device_measurements');
  await knex.schema.dropTable('lens_designs');
  await knex.schema.dropTable('lab_settings');
}
