import { MeasurementCreateInput, type MeasurementKind } from '@/shared/schemas/device';
import { localDate, localTime, START_FORMAT_MESSAGE, startedAtFrom } from '@/components/steps/step-form-values';
import { errorsFromIssues, type PathErrors } from '@/components/ui/field-errors';

export interface MeasurementRowValues {
  x: string;
  y: string;
}

/** The add-a-measurement form as typed. */
export interface MeasurementFormValues {
  kind: MeasurementKind;
  rows: MeasurementRowValues[];
  instrument: string;
  date: string;
  time: string;
  note: string;
}

export const BLANK_ROW: MeasurementRowValues = { x: '', y: '' };

export function blankMeasurement(now: Date): MeasurementFormValues {
  return {
    kind: 'focal_length_vs_wavelength',
    rows: [{ ...BLANK_ROW }],
    instrument: '',
    date: localDate(now),
    time: localTime(now),
    note: '',
  };
}

/** A typed number (decimal comma accepted); NaN for text that is not one, so the schema names it. */
function readNumber(text: string): number | undefined {
  const trimmed = text.trim().replace(',', '.');
  if (trimmed === '') return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(trimmed) ? Number(trimmed) : Number.NaN;
}

export type MeasurementParse =
  { ok: true; input: ReturnType<typeof MeasurementCreateInput.parse> } | { ok: false; errors: PathErrors };

/**
 * Reads the form through the server's schema. Rows left wholly empty are dropped (a spare row
 * at the end is normal); half-filled rows are kept so the schema points at the missing number.
 */
export function parseMeasurementForm(values: MeasurementFormValues): MeasurementParse {
  const measuredAt = startedAtFrom(values.date, values.time);
  // Indexes of the rows sent, so the schema's `rows.<i>` messages land on the row typed.
  const sent = values.rows.flatMap((row, index) => (row.x.trim() !== '' || row.y.trim() !== '' ? [index] : []));
  const rows = sent.map((index) => ({ x: readNumber(values.rows[index].x), y: readNumber(values.rows[index].y) }));
  const parsed = MeasurementCreateInput.safeParse({
    kind: values.kind,
    rows,
    instrument: values.instrument.trim() || undefined,
    measuredAt: measuredAt ?? undefined,
    note: values.note.trim() || undefined,
  });
  if (parsed.success && measuredAt) return { ok: true, input: parsed.data };
  const errors: PathErrors = {};
  for (const [key, messages] of Object.entries(parsed.success ? {} : errorsFromIssues(parsed.error.issues))) {
    const row = /^rows\.(\d+)\.(.+)$/.exec(key);
    errors[row ? `rows.${sent[Number(row[1])]}.${row[2]}` : key] = messages;
  }
  if (!measuredAt) errors.measuredAt = [START_FORMAT_MESSAGE];
  return { ok: false, errors };
}
