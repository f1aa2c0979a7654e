import type { Knex } from 'knex';

/** Where samples are kept (places holding boxes of slots) and the label sheets they are printed on. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('storage_places', (table) => {
    table.bigIncrements('id');
    table.text('name').notNullable();
    table.text('kind').notNullable();
    table.bigInteger('parent_id').references('storage_places.id').onDelete('RESTRICT').index();
    table.text('note');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check(
      "kind in ('room', 'cabinet', 'desiccator', 'glovebox', 'fridge', 'freezer', 'shelf', 'other')",
      [],
      'storage_places_kind_known',
    );
    table.check('parent_id is null or parent_id <> id', [], 'storage_places_not_own_parent');
  });
  await knex.raw('create unique index storage_places_name_unique on storage_places (coalesce(parent_id, 0), lower(name))');

  await knex.schema.createTable('boxes', (table) => {
    table.bigIncrements('id');
    table.text('code').notNullable().unique();
    table.text('name').notNullable();
    table.bigInteger('place_id').references('storage_places.id').onDelete('RESTRICT').index();
    table.integer('rows').notNullable();
    table.integer('columns').notNullable();
    table.text('row_labels').notNullable().defaultTo('letters');
    table.text('column_labels').notNullable().defaultTo('numbers');
    table.text('note');
    table.timestamps(true, true);
    table.check('rows between 1 and 26', [], 'boxes_rows_range');
    table.check('columns between 1 and 50', [], 'boxes_columns_range');
    table.check("row_labels in ('letters', 'numbers')", [], 'boxes_row_labels_known');
    table.check("column_labels in ('letters', 'numbers')", [], 'boxes_column_labels_known');
  });

  // One place per sample; one sample per slot (the unique index is the rule, not just the code).
  await knex.schema.createTable('sample_locations', (table) => {
    table.bigInteger('sample_id').primary().references('samples.id').onDelete('RESTRICT');
    table.bigInteger('box_id').notNullable().references('boxes.id').onDelete('RESTRICT');
    table.integer('row').notNullable();
    table.integer('column').notNullable();
    table.bigInteger('placed_by_id').references('users.id').onDelete('SET NULL');
    table.timestamp('placed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.unique(['box_id', 'row', 'column'], { indexName: 'sample_locations_one_per_slot' });
    table.check('"row" >= 1 and "column" >= 1', [], 'sample_locations_slot_positive');
  });

  await knex.schema.createTable('label_templates', (table) => {
    table.bigIncrements('id');
    table.text('name').notNullable().unique();
    table.text('shape').notNullable();
    table.double('label_width_mm').notNullable();
    table.double('label_height_mm').notNullable();
    table.double('page_width_mm').notNullable();
    table.double('page_height_mm').notNullable();
    table.integer('columns').notNullable();
    table.integer('rows').notNullable();
    table.double('margin_left_mm').notNullable();
    table.double('margin_top_mm').notNullable();
    table.double('column_gap_mm').notNullable().defaultTo(0);
    table.double('row_gap_mm').notNullable().defaultTo(0);
    table.boolean('built_in').notNullable().defaultTo(false);
    table.bigInteger('created_by_id').references('users.id').onDelete('SET NULL');
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("shape in ('round', 'rectangle')", [], 'label_templates_shape_known');
    table.check('label_width_mm > 0 and label_height_mm > 0 and columns >= 1 and rows >= 1', [], 'label_templates_positive');
    table.check(
      'margin_left_mm + columns * label_width_mm + (columns - 1) * column_gap_mm <= page_width_mm + 0.01 and ' +
        'margin_top_mm + rows * label_height_mm + (rows - 1) * row_gap_mm <= page_height_mm + 0.01',
      [],
      'label_templates_fit_page',
    );
  });

  // Sheet sizes of label stock common in labs (common practice, no source): dimensions are
  // generic formats, not any maker's product.
  await knex('label_templates').insert([
    {
      name: 'Round cap labels, 9.5 mm, A4 sheet',
      shape: 'round',
      labelWidthMm: 9.5,
      labelHeightMm: 9.5,
      pageWidthMm: 210,
      pageHeightMm: 297,
      columns: 15,
      rows: 21,
      marginLeftMm: 12,
      marginTopMm: 14,
      columnGapMm: 3,
      rowGapMm: 3.6,
      builtIn: true,
    },
    {
      name: 'Cryo vial labels, 33 × 13 mm, A4 sheet',
      shape: 'rectangle',
      labelWidthMm: 33,
      labelHeightMm: 13,
      pageWidthMm: 210,
      pageHeightMm: 297,
      columns: 5,
      rows: 17,
      marginLeftMm: 12,
      marginTopMm: 12,
      columnGapMm: 5,
      rowGapMm: 3.8,
      builtIn: true,
    },
    {
      name: 'Chip carrier labels, 20 × 10 mm, A4 sheet',
      shape: 'rectangle',
      labelWidthMm: 20,
      labelHeightMm: 10,
      pageWidthMm: 210,
      pageHeightMm: 297,
      columns: 8,
      rows: 22,
      marginLeftMm: 10,
      marginTopMm: 12,
      columnGapMm: 4.3,
      rowGapMm: 2.5,
      builtIn: true,
    },
    {
      name: 'Box labels, 70 × 37 mm, A4 sheet',
      shape: 'rectangle',
      labelWidthMm: 70,
      labelHeightMm: 37,
      pageWidthMm: 210,
      pageHeightMm: 297,
      columns: 3,
      rows: 8,
      marginLeftMm: 0,
      marginTopMm: 0.5,
      columnGapMm: 0,
      rowGapMm: 0,
      builtIn: true,
    },
    {
      name: 'Single label, 50 × 25 mm (roll printer)',
      shape: 'rectangle',
      labelWidthMm: 50,
      labelHeightMm: 25,
      pageWidthMm: 50,
      pageHeightMm: 25,
      columns: 1,
      rows: 1,
      marginLeftMm: 0,
      marginTopMm: 0,
      columnGapMm: 0,
      rowGapMm: 0,
      builtIn: true,
    },
  ]);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('label_templates');
  await knex.schema.dropTable('sample_locations');
  await knex.schema.dropTable('boxes');
  await knex.schema.dropTable('storage_places');
}
