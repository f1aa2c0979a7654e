import { z } from 'zod';
import { SAMPLE_KINDS, SAMPLE_STATUSES } from '../samples';

/** Rows one import may hold; larger sheets are split (keeps a preview readable and a commit short). */
export const IMPORT_MAX_ROWS = 5_000;
export const IMPORT_MAX_BYTES = 5 * 1024 * 1024;

/**
 * Columns of the sample CSV, in export order. Import accepts the same headers (any case, spaces
 * or underscores), so a lab can export, edit in a spreadsheet and re-import; `code`, `owner`,
 * `created_at` and `updated_at` are ignored on import (new records get new codes and owners
 * are matched by `owner_email`).
 */
export const SAMPLE_CSV_COLUMNS = [
  'code',
  'kind',
  'material',
  'name',
  'status',
  'owner',
  'owner_email',
  'layer_estimate',
  'note',
  'supplier',
  'supplier_lot',
  'growth_method',
  'substrate',
  'oxide_thickness_nm',
  'chip_width_mm',
  'chip_height_mm',
  'position_x_um',
  'position_y_um',
  'flake_size_um',
  'device_type',
  'created_at',
  'updated_at',
] as const;
export type SampleCsvColumn = (typeof SAMPLE_CSV_COLUMNS)[number];

export const IMPORT_IGNORED_COLUMNS: readonly SampleCsvColumn[] = ['code', 'owner', 'layer_estimate', 'created_at', 'updated_at'];

export const SampleImportQuery = z
  .object({ mode: z.enum(['preview', 'commit'], { error: 'Choose preview or commit.' }).default('preview') })
  .meta({ id: 'SampleImportQuery' });

export const SampleImportBody = z
  .string({ error: 'Send the CSV text with Content-Type: text/csv.' })
  .min(1, 'The CSV file is empty.')
  .max(IMPORT_MAX_BYTES, 'The CSV file is larger than 5 MB; split it.');

export const SampleImportRow = z.object({
  line: z.number(),
  ok: z.boolean(),
  errors: z.record(z.string(), z.array(z.string())),
  kind: z.enum(SAMPLE_KINDS).nullable(),
  material: z.string().nullable(),
  name: z.string().nullable(),
  status: z.enum(SAMPLE_STATUSES).nullable(),
  code: z.string().nullable(),
});
export type SampleImportRow = z.infer<typeof SampleImportRow>;

export const SampleImportResult = z
  .object({
    mode: z.enum(['preview', 'commit']),
    rowCount: z.number(),
    validCount: z.number(),
    createdCount: z.number(),
    ignoredColumns: z.array(z.string()),
    rows: z.array(SampleImportRow),
  })
  .meta({ id: 'SampleImportResult' });
export type SampleImportResult = z.infer<typeof SampleImportResult>;
