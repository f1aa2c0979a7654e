import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify';
import { SampleCreateInput, type SampleProperties } from '../../shared/schemas/sample';
import {
  IMPORT_IGNORED_COLUMNS,
  IMPORT_MAX_ROWS,
  SAMPLE_CSV_COLUMNS,
  type SampleCsvColumn,
  type SampleImportResult,
  type SampleImportRow,
} from '../../shared/schemas/sample-import';
import { invalid, type FieldErrors } from '../errors';
import type { UserModel } from '../models/user-model';
import { appendHistory } from './history-chain';
import { createdEvent, insertSamples, type NewSample } from './sample-registry';

/** CSV columns that hold a kind-specific property, and which one. */
const PROPERTY_COLUMNS: Partial<Record<SampleCsvColumn, keyof SampleProperties>> = {
  supplier: 'supplier',
  supplier_lot: 'supplierLot',
  growth_method: 'growthMethod',
  substrate: 'substrate',
  oxide_thickness_nm: 'oxideThicknessNm',
  chip_width_mm: 'chipWidthMm',
  chip_height_mm: 'chipHeightMm',
  position_x_um: 'positionXUm',
  position_y_um: 'positionYUm',
  flake_size_um: 'flakeSizeUm',
  device_type: 'deviceType',
};
const NUMERIC_PROPERTIES = new Set<keyof SampleProperties>([
  'oxideThicknessNm',
  'chipWidthMm',
  'chipHeightMm',
  'positionXUm',
  'positionYUm',
  'flakeSizeUm',
]);
const COLUMN_OF_FIELD: Record<string, SampleCsvColumn> = {
  kind: 'kind',
  material: 'material',
  name: 'name',
  note: 'note',
  status: 'status',
  ...Object.fromEntries(Object.entries(PROPERTY_COLUMNS).map(([column, property]) => [`properties.${property}`, column])),
};

const normaliseHeader = (header: string) =>
  header
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');

/**
 * Spreadsheet programs run cells that start with = + - @ as formulas; text cells that do are
 * prefixed with a quote on export (OWASP, "CSV Injection").
 */
const defuse = (value: string | null | undefined) => (value && /^[=+\-@\t\r]/.test(value) ? `'${value}` : (value ?? ''));

export interface ExportRow {
  code: string;
  kind: string;
  material: string;
  name: string | null;
  status: string;
  ownerName: string;
  ownerEmail: string;
  layerEstimate: number | null;
  note: string | null;
  properties: SampleProperties | null;
  createdAt: Date;
  updatedAt: Date;
}

/** One export row as CSV cells. */
export function toCsvRecord(row: ExportRow): Record<SampleCsvColumn, string | number> {
  const properties = row.properties ?? {};
  const record = {
    code: row.code,
    kind: row.kind,
    material: defuse(row.material),
    name: defuse(row.name),
    status: row.status,
    owner: defuse(row.ownerName),
    owner_email: row.ownerEmail,
    layer_estimate: row.layerEstimate ?? '',
    note: defuse(row.note),
    created_at: row.createdAt.toISOString(),
    updated_at: row.updatedAt.toISOString(),
  } as Record<SampleCsvColumn, string | number>;
  for (const [column, property] of Object.entries(PROPERTY_COLUMNS) as [SampleCsvColumn, keyof SampleProperties][]) {
    const value = properties[property];
    record[column] = typeof value === 'number' ? value : defuse(value);
  }
  return record;
}

/** A CSV stringifier for export rows made by `toCsvRecord`, header first. */
export function sampleCsvStringifier() {
  return stringify({ header: true, columns: [...SAMPLE_CSV_COLUMNS] });
}

function parseCsv(text: string): { headers: string[]; records: Record<string, string>[] } {
  let headers: string[] = [];
  try {
    const records = parse(text, {
      bom: true,
      trim: true,
      skip_empty_lines: true,
      columns: (header: string[]) => {
        headers = header.map(normaliseHeader);
        return headers;
      },
    }) as Record<string, string>[];
    return { headers, records };
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    throw invalid({ file: [`The file is not readable as CSV: ${detail}`] }, 'The file is not readable as CSV.');
  }
}

function numberCell(value: string, column: string, errors: FieldErrors): number | undefined {
  const parsed = Number(value.replace(',', '.'));
  if (!Number.isFinite(parsed)) {
    (errors[column] ??= []).push(`"${value}" is not a number.`);
    return undefined;
  }
  return parsed;
}

interface CheckedRow {
  row: SampleImportRow;
  sample: NewSample | null;
}

function checkRow(record: Record<string, string>, line: number, owners: Map<string, number>, importerId: number): CheckedRow {
  const errors: FieldErrors = {};
  const cell = (column: SampleCsvColumn) => (record[column] ?? '').trim() || undefined;
  const properties: Record<string, string | number> = {};
  for (const [column, property] of Object.entries(PROPERTY_COLUMNS) as [SampleCsvColumn, keyof SampleProperties][]) {
    const value = cell(column);
    if (value === undefined) continue;
    const parsed = NUMERIC_PROPERTIES.has(property) ? numberCell(value, column, errors) : value;
    if (parsed !== undefined) properties[property] = parsed;
  }
  const ownerEmail = cell('owner_email')?.toLowerCase();
  const ownerId = ownerEmail ? owners.get(ownerEmail) : importerId;
  if (ownerId === undefined) (errors.owner_email ??= []).push(`No active person has the address ${ownerEmail}.`);
  const status = cell('status');
  if (status === 'retired') (errors.status ??= []).push('Import cannot create retired records.');
  const candidate = SampleCreateInput.safeParse({
    kind: cell('kind')?.toLowerCase(),
    material: cell('material'),
    name: cell('name'),
    note: cell('note'),
    status: status?.toLowerCase().replace(/\s+/g, '_'),
    properties,
  });
  if (!candidate.success) {
    for (const issue of candidate.error.issues) {
      const column = COLUMN_OF_FIELD[issue.path.join('.')] ?? issue.path.join('.');
      (errors[column] ??= []).push(issue.message);
    }
  }
  const ok = candidate.success && Object.keys(errors).length === 0;
  return {
    row: {
      line,
      ok,
      errors,
      kind: candidate.success ? candidate.data.kind : null,
      material: candidate.success ? candidate.data.material : (cell('material') ?? null),
      name: cell('name') ?? null,
      status: candidate.success ? (candidate.data.status ?? 'ready') : null,
      code: null,
    },
    sample:
      ok && candidate.success && ownerId !== undefined
        ? { ...candidate.data, status: candidate.data.status ?? 'ready', ownerId }
        : null,
  };
}

/**
 * Reads a sample CSV (e.g. the lab's old spreadsheet). A preview reports every row's problems
 * and changes nothing; a commit creates all rows in one transaction, or none when any row has
 * a problem.
 */
export async function importSamplesCsv(props: {
  trx: Knex.Transaction;
  actor: UserModel;
  csv: string;
  mode: 'preview' | 'commit';
}): Promise<SampleImportResult> {
  const { headers, records } = parseCsv(props.csv);
  const unknown = headers.filter((header) => !(SAMPLE_CSV_COLUMNS as readonly string[]).includes(header));
  if (unknown.length) {
    throw invalid(
      { file: [`Unknown column(s): ${unknown.join(', ')}. Known columns: ${SAMPLE_CSV_COLUMNS.join(', ')}.`] },
      'The CSV has columns Flakeline does not know.',
    );
  }
  if (!headers.includes('kind') || !headers.includes('material')) {
    throw invalid({ file: ['The CSV needs at least the columns kind and material.'] }, 'The CSV lacks required columns.');
  }
  if (records.length === 0) throw invalid({ file: ['The CSV has a header but no rows.'] }, 'The CSV has no rows.');
  if (records.length > IMPORT_MAX_ROWS) {
    throw invalid({ file: [`At most ${IMPORT_MAX_ROWS} rows per import; this file has ${records.length}.`] }, 'Too many rows.');
  }

  const people = await props.trx('users').where('status', 'active').select('id', 'email');
  const owners = new Map<string, number>(people.map((person: { id: number; email: string }) => [person.email, person.id]));
  // Line numbers as a spreadsheet shows them: the header is line 1.
  const checked = records.map((record, index) => checkRow(record, index + 2, owners, props.actor.id));
  const rows = checked.map((entry) => entry.row);
  const validCount = rows.filter((row) => row.ok).length;
  const ignoredColumns = headers.filter((header) => IMPORT_IGNORED_COLUMNS.includes(header as SampleCsvColumn));
  const result = { mode: props.mode, rowCount: rows.length, validCount, createdCount: 0, ignoredColumns, rows };
  if (props.mode === 'preview') return result;

  if (validCount !== rows.length) {
    const fields: FieldErrors = {};
    for (const row of rows) {
      for (const [column, messages] of Object.entries(row.errors)) fields[`line ${row.line}.${column}`] = messages;
    }
    throw invalid(fields, `${rows.length - validCount} of ${rows.length} rows have problems; nothing was imported.`);
  }
  const samples = checked.flatMap((entry) => (entry.sample ? [entry.sample] : []));
  const created = await insertSamples(props.trx, props.actor.id, samples);
  created.forEach((sample, index) => {
    rows[index].code = sample.code;
  });
  await appendHistory(props.trx, [
    ...created.map((sample) => createdEvent(props.actor.id, sample)),
    {
      type: 'samples.imported',
      actorId: props.actor.id,
      payload: {
        rows: created.length,
        codes: created.map((sample) => sample.code),
        sha256: createHash('sha256').update(props.csv).digest('hex'),
      },
    },
  ]);
  return { ...result, createdCount: created.length };
}
