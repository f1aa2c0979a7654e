import type { Knex } from 'knex';

const OLD_STEP_TYPES =
  "('exfoliation', 'cvd_growth', 'transfer', 'stacking', 'lithography', 'etching', 'annealing', 'encapsulation', 'metal_deposition', 'cleaving')";
const NEW_STEP_TYPES =
  "('exfoliation', 'cvd_growth', 'transfer', 'stacking', 'lithography', 'etching', 'annealing', 'encapsulation', 'metal_deposition', 'cleaving', 'flake_search')";

async function setStepTypes(knex: Knex, types: string): Promise<void> {
  for (const [table, constraint] of [
    ['steps', 'steps_type_known'],
    ['step_templates', 'step_templates_type_known'],
  ]) {
    await knex.raw(`alter table ${table} drop constraint ${constraint}`);
    await knex.raw(`alter table ${table} add constraint ${constraint} check (type in ${types})`);
  }
}

/**
 * Thickness evidence: stored files (content-addressed, checksummed), microscope calibrations,
 * and evidence items (micrographs, Raman and PL spectra, AFM profiles) attached to a sample or a
 * step, each with its analysis and layer estimate. A flake found on a chip gets its own step type.
 */
export async function up(knex: Knex): Promise<void> {
  // One row per distinct content: the SHA-256 is both the identity and the storage key.
  await knex.schema.createTable('stored_files', (table) => {
    table.bigIncrements('id');
    table.text('sha256').notNullable().unique();
    table.bigInteger('byte_size').notNullable();
    table.text('media_type').notNullable();
    table.integer('width_px');
    table.integer('height_px');
    // The thumbnail is a blob of its own (PNG), checked like any other when served.
    table.text('thumbnail_sha256');
    table.bigInteger('created_by_id').references('users.id').onDelete('SET NULL');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("sha256 ~ '^[0-9a-f]{64}$'", [], 'stored_files_sha256_hex');
    table.check("thumbnail_sha256 is null or thumbnail_sha256 ~ '^[0-9a-f]{64}$'", [], 'stored_files_thumbnail_hex');
    table.check('byte_size >= 0', [], 'stored_files_size');
    table.check("media_type in ('image/jpeg', 'image/png', 'image/tiff', 'text/csv', 'text/plain')", [], 'stored_files_media_type');
  });

  // µm per pixel for one microscope and objective; kept as a record so a micrograph names it.
  await knex.schema.createTable('microscope_calibrations', (table) => {
    table.bigIncrements('id');
    table.text('microscope').notNullable();
    table.double('objective_magnification').notNullable();
    table.double('um_per_pixel').notNullable();
    table.text('note');
    table.bigInteger('created_by_id').references('users.id').onDelete('SET NULL');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.timestamp('retired_at', { useTz: true });
    table.check('objective_magnification > 0', [], 'calibrations_magnification_positive');
    table.check('um_per_pixel > 0', [], 'calibrations_scale_positive');
    table.check('length(trim(microscope)) between 1 and 80', [], 'calibrations_microscope_length');
  });
  await knex.raw(
    'create unique index microscope_calibrations_current on microscope_calibrations (lower(microscope), objective_magnification) where retired_at is null',
  );

  await knex.schema.createTable('evidence', (table) => {
    table.bigIncrements('id');
    table.bigInteger('sample_id').references('samples.id').onDelete('RESTRICT');
    table.bigInteger('step_id').references('steps.id').onDelete('RESTRICT');
    table.text('kind').notNullable();
    table.bigInteger('file_id').notNullable().references('stored_files.id').onDelete('RESTRICT');
    table.text('original_name');
    // What the researcher told us (objective, calibration, filter, exposure, laser line, material...).
    table.jsonb('metadata').notNullable().defaultTo('{}');
    // What Flakeline computed from the file (fitted peaks, contrasts, candidates...).
    table.jsonb('analysis').notNullable().defaultTo('{}');
    table.integer('layer_count');
    table.double('layer_uncertainty');
    table.text('layer_method');
    table.bigInteger('created_by_id').references('users.id').onDelete('SET NULL');
    table.timestamps(true, true);
    table.integer('version').notNullable().defaultTo(1);
    table.check('sample_id is not null or step_id is not null', [], 'evidence_attached');
    table.check("kind in ('micrograph', 'raman', 'pl', 'afm')", [], 'evidence_kind_known');
    table.check('layer_count is null or layer_count between 1 and 100', [], 'evidence_layer_count_range');
    table.check('layer_uncertainty is null or layer_uncertainty >= 0', [], 'evidence_layer_uncertainty');
    table.index(['sample_id', 'created_at']);
    table.index(['step_id']);
    table.index(['file_id']);
  });

  await setStepTypes(knex, NEW_STEP_TYPES);
}

export async function down(knex: Knex): Promise<void> {
  await knex('steps').where('type', 'flake_search').delete();
  await knex('step_templates').where('type', 'flake_search').delete();
  await setStepTypes(knex, OLD_STEP_TYPES);
  await knex.schema.dropTable('evidence');
  await knex.schema.dropTable('microscope_calibrations');
  await knex.schema.dropTable('stored_files');
}
