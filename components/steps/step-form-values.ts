import type { SampleKind } from '@/shared/samples';
import type { SampleSummary } from '@/shared/schemas/sample';
import type { StepType } from '@/shared/steps';
import { numberOrText } from '@/components/samples/sample-form-values';
import type { PathErrors } from '@/components/ui/field-errors';
import { isOptionalParameter, parameterDefault, stepFields } from './step-fields';

export interface StepInputItem {
  code: string;
  /** The step used it up (its status becomes "used up"). */
  consumed: boolean;
  /** Known when it was picked from search results; otherwise looked up by code. */
  summary: SampleSummary | null;
}

export interface StepOutputRow {
  /** Stable across removals, for React keys. */
  key: number;
  kind: SampleKind | null;
  count: string;
  material: string;
}

/** Parameter text as typed, per step type, so switching type and back keeps what was entered. */
export type ParameterValues = Partial<Record<StepType, Record<string, string>>>;

export interface StepFormValues {
  type: StepType | null;
  parameters: ParameterValues;
  /** Local date and time of the start, YYYY-MM-DD and HH:MM. */
  date: string;
  time: string;
  instrument: string;
  notes: string;
  inputs: StepInputItem[];
  outputs: StepOutputRow[];
}

const pad = (value: number) => String(value).padStart(2, '0');

export function localDate(moment: Date): string {
  return `${moment.getFullYear()}-${pad(moment.getMonth() + 1)}-${pad(moment.getDate())}`;
}

export function localTime(moment: Date): string {
  return `${pad(moment.getHours())}:${pad(moment.getMinutes())}`;
}

export function blankStepValues(now: Date, inputCode: string | null): StepFormValues {
  return {
    type: null,
    parameters: {},
    date: localDate(now),
    time: localTime(now),
    instrument: '',
    notes: '',
    inputs: inputCode ? [{ code: inputCode, consumed: false, summary: null }] : [],
    outputs: [],
  };
}

/** Choice parameters with a schema default (pretreatment "none") start chosen. */
export function defaultParameterValues(type: StepType): Record<string, string> {
  const values: Record<string, string> = {};
  for (const field of stepFields(type)) {
    const fallback = parameterDefault(type, field.name);
    if (field.control === 'choice' && typeof fallback === 'string') values[field.name] = fallback;
  }
  return values;
}

function listItems(text: string): string[] {
  return text
    .split(/[,;]/)
    .map((item) => item.trim())
    .filter(Boolean);
}

/**
 * The parameters object for the shared schema. Empty optional fields are left out; empty required
 * ones are sent empty so the schema answers with its own words ("Enter the resist.").
 */
export function parametersCandidate(type: StepType, values: Record<string, string>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const field of stepFields(type)) {
    const text = values[field.name] ?? '';
    const optional = isOptionalParameter(type, field.name);
    let value: unknown;
    switch (field.control) {
      case 'number':
      case 'integer':
        value = numberOrText(text);
        break;
      case 'textList':
        value = listItems(text);
        break;
      case 'numberList':
        value = listItems(text).map((item) => numberOrText(item));
        break;
      case 'choice':
        value = text || undefined;
        break;
      case 'text':
        value = text.trim() || (optional ? undefined : '');
        break;
    }
    if (Array.isArray(value) && value.length === 0 && optional) value = undefined;
    if (value !== undefined) out[field.name] = value;
  }
  return out;
}

const DATE_PATTERN = /^(\d{4})-(\d{1,2})-(\d{1,2})$/;
const TIME_PATTERN = /^(\d{1,2})[:.](\d{2})$/;
export const START_FORMAT_MESSAGE = 'Give the date as YYYY-MM-DD and the time as HH:MM (24-hour clock).';

/** The start as an ISO timestamp, or null when the date or time cannot be read (or do not exist, e.g. 31 April). */
export function startedAtFrom(date: string, time: string): string | null {
  const day = DATE_PATTERN.exec(date.trim());
  const clock = TIME_PATTERN.exec(time.trim());
  if (!day || !clock) return null;
  const [year, month, dayOfMonth, hours, minutes] = [day[1], day[2], day[3], clock[1], clock[2]].map(Number);
  const moment = new Date(year, month - 1, dayOfMonth, hours, minutes);
  const exists =
    moment.getFullYear() === year &&
    moment.getMonth() === month - 1 &&
    moment.getDate() === dayOfMonth &&
    moment.getHours() === hours &&
    moment.getMinutes() === minutes;
  return exists ? moment.toISOString() : null;
}

/** A candidate for `StepCreateInput`, still to be checked by the schema, and any problem with the start. */
export function stepCandidate(values: StepFormValues): { candidate: Record<string, unknown>; startProblem: string | null } {
  const startedAt = startedAtFrom(values.date, values.time);
  return {
    startProblem: startedAt ? null : START_FORMAT_MESSAGE,
    candidate: {
      type: values.type ?? undefined,
      parameters: values.type ? parametersCandidate(values.type, values.parameters[values.type] ?? {}) : {},
      startedAt: startedAt ?? undefined,
      instrument: values.instrument.trim() || undefined,
      notes: values.notes.trim() || undefined,
      inputs: values.inputs.map((item) => ({ code: item.code, consumed: item.consumed })),
      outputs: values.outputs.map((row) => ({
        kind: row.kind ?? undefined,
        count: numberOrText(row.count),
        material: row.material.trim() || undefined,
      })),
    },
  };
}

/** Messages at `prefix` and anywhere beneath it (`parameters.zoneTemperaturesC.1`). */
export function errorsUnder(errors: PathErrors, prefix: string): string[] {
  return Object.entries(errors)
    .filter(([key]) => key === prefix || key.startsWith(`${prefix}.`))
    .flatMap(([, messages]) => messages);
}

/** Drops the messages at `prefix` and beneath it, once the person changes that part. */
export function withoutErrorsUnder(errors: PathErrors, prefix: string): PathErrors {
  return Object.fromEntries(Object.entries(errors).filter(([key]) => !(key === prefix || key.startsWith(`${prefix}.`))));
}

const SHOWN_KEYS = [/^type$/, /^startedAt$/, /^instrument$/, /^notes$/, /^inputs(\.\d+(\..+)?)?$/, /^outputs(\.\d+(\..+)?)?$/];

/** Whether the form shows a message beside a field (the rest go in the banner above the button). */
export function isShownKey(key: string, type: StepType | null): boolean {
  if (SHOWN_KEYS.some((pattern) => pattern.test(key))) return true;
  return (
    type !== null &&
    stepFields(type).some((field) => key === `parameters.${field.name}` || key.startsWith(`parameters.${field.name}.`))
  );
}
