import { EDITABLE_STATUSES, type SampleKind } from '@/shared/samples';
import type { Sample, SampleProperties } from '@/shared/schemas/sample';
import { PROPERTY_FIELDS, type PropertyName } from './property-fields';

export type EditableStatus = (typeof EDITABLE_STATUSES)[number];

/** What the sample form holds: text as typed, turned into numbers only when it is checked. */
export interface SampleFormValues {
  kind: SampleKind | null;
  material: string;
  name: string;
  note: string;
  status: EditableStatus | null;
  properties: Partial<Record<PropertyName, string>>;
}

export function blankSampleValues(kind: SampleKind | null = null): SampleFormValues {
  return { kind, material: '', name: '', note: '', status: null, properties: {} };
}

export function isEditableStatus(value: string): value is EditableStatus {
  return EDITABLE_STATUSES.some((status) => status === value);
}

export function sampleValues(sample: Sample): SampleFormValues {
  const properties: Partial<Record<PropertyName, string>> = {};
  for (const [name, value] of Object.entries(sample.properties) as [PropertyName, unknown][]) {
    if (value !== undefined && value !== null) properties[name] = String(value);
  }
  return {
    kind: sample.kind,
    material: sample.material,
    name: sample.name ?? '',
    note: sample.note ?? '',
    status: isEditableStatus(sample.status) ? sample.status : null,
    properties,
  };
}

/**
 * A typed number, accepting a decimal comma. Anything that is not a number is passed on as typed,
 * so the shared schema answers with its own message ("… must be a number").
 */
export function numberOrText(text: string): number | string | undefined {
  const trimmed = text.trim();
  if (!trimmed) return undefined;
  const value = Number(trimmed.replace(',', '.'));
  return Number.isFinite(value) ? value : trimmed;
}

/** The kind's properties from the form, leaving facts of other kinds (kept from earlier edits) alone. */
function propertiesFrom(values: SampleFormValues, kept: SampleProperties = {}): Record<string, unknown> {
  const out: Record<string, unknown> = { ...kept };
  for (const field of values.kind ? PROPERTY_FIELDS[values.kind] : []) {
    const text = values.properties[field.name] ?? '';
    const value = field.control === 'number' ? numberOrText(text) : text.trim() || undefined;
    if (value === undefined) delete out[field.name];
    else out[field.name] = value;
  }
  return out;
}

/** A candidate for `SampleCreateInput`, still to be checked by the schema. */
export function createCandidate(values: SampleFormValues): Record<string, unknown> {
  return {
    kind: values.kind ?? undefined,
    material: values.material,
    name: values.name.trim() || undefined,
    note: values.note.trim() || undefined,
    properties: propertiesFrom(values),
  };
}

/** A candidate for `SampleUpdateInput` made from `base`: cleared texts become null, so they are cleared. */
export function updateCandidate(values: SampleFormValues, base: Sample): Record<string, unknown> {
  return {
    version: base.version,
    material: values.material,
    name: values.name.trim() || null,
    note: values.note.trim() || null,
    status: values.status ?? undefined,
    properties: propertiesFrom(values, base.properties),
  };
}

/** What differs between two versions of a record, in the shape of the history's `changes`. */
export function recordChanges(before: Sample, after: Sample): Record<string, { from: unknown; to: unknown }> {
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const field of ['material', 'name', 'note', 'status', 'properties'] as const) {
    if (JSON.stringify(before[field]) !== JSON.stringify(after[field])) {
      changes[field] = { from: before[field], to: after[field] };
    }
  }
  return changes;
}

/** Error keys whose field changed between two sets of values, so their complaint can be dropped. */
export function changedKeys(before: SampleFormValues, after: SampleFormValues): string[] {
  const keys: string[] = [];
  for (const field of ['kind', 'material', 'name', 'note', 'status'] as const) {
    if (before[field] !== after[field]) keys.push(field);
  }
  for (const name of new Set([...Object.keys(before.properties), ...Object.keys(after.properties)]) as Set<PropertyName>) {
    if (before.properties[name] !== after.properties[name]) keys.push(`properties.${name}`);
  }
  return keys;
}

const TOP_FIELDS = ['material', 'name', 'note', 'status'] as const;

/**
 * Puts the person's own changes (what differs from the version they opened) on top of the record
 * as it is now, keeping a colleague's changes to every other field. Also names the fields both
 * changed differently: there the person's value wins, and they should know.
 */
export function rebaseValues(
  mine: SampleFormValues,
  base: Sample,
  current: Sample,
): { values: SampleFormValues; bothChanged: string[] } {
  const opened = sampleValues(base);
  const theirs = sampleValues(current);
  const values: SampleFormValues = { ...theirs, properties: { ...theirs.properties } };
  const bothChanged: string[] = [];
  const clash = (own: unknown, start: unknown, other: unknown) => other !== start && other !== own;
  for (const field of TOP_FIELDS) {
    if (mine[field] === opened[field]) continue;
    if (field === 'status') values.status = mine.status;
    else values[field] = mine[field];
    if (clash(mine[field], opened[field], theirs[field])) bothChanged.push(field);
  }
  const names = new Set([...Object.keys(mine.properties), ...Object.keys(opened.properties)]) as Set<PropertyName>;
  for (const name of names) {
    const own = mine.properties[name] ?? '';
    const start = opened.properties[name] ?? '';
    if (own === start) continue;
    values.properties[name] = own;
    if (clash(own, start, theirs.properties[name] ?? '')) bothChanged.push(`properties.${name}`);
  }
  return { values, bothChanged };
}
