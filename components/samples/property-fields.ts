import type { SampleKind } from '@/shared/samples';
import { SUBSTRATE_LABELS, SUBSTRATES, type SampleProperties } from '@/shared/schemas/sample';
import type { Choice } from '@/components/ui/choice-group';

export type PropertyName = keyof SampleProperties;
type Substrate = (typeof SUBSTRATES)[number];

export interface PropertyField {
  name: PropertyName;
  /** Without the unit; forms show "Label (unit)", read-only views "value unit". */
  label: string;
  unit?: string;
  control: 'text' | 'number' | 'substrate';
}

export const SUBSTRATE_CHOICES: readonly Choice<Substrate>[] = SUBSTRATES.map((value) => ({
  value,
  label: SUBSTRATE_LABELS[value],
}));

const FIELDS: Record<PropertyName, PropertyField> = {
  supplier: { name: 'supplier', label: 'Supplier', control: 'text' },
  supplierLot: { name: 'supplierLot', label: 'Supplier lot', control: 'text' },
  growthMethod: { name: 'growthMethod', label: 'Growth method', control: 'text' },
  substrate: { name: 'substrate', label: 'Substrate', control: 'substrate' },
  oxideThicknessNm: { name: 'oxideThicknessNm', label: 'Oxide thickness', unit: 'nm', control: 'number' },
  chipWidthMm: { name: 'chipWidthMm', label: 'Chip width', unit: 'mm', control: 'number' },
  chipHeightMm: { name: 'chipHeightMm', label: 'Chip height', unit: 'mm', control: 'number' },
  positionXUm: { name: 'positionXUm', label: 'Position x', unit: 'µm', control: 'number' },
  positionYUm: { name: 'positionYUm', label: 'Position y', unit: 'µm', control: 'number' },
  flakeSizeUm: { name: 'flakeSizeUm', label: 'Flake size', unit: 'µm', control: 'number' },
  deviceType: { name: 'deviceType', label: 'Device type', control: 'text' },
};

/** Every property in display order. */
export const ALL_PROPERTY_FIELDS: readonly PropertyField[] = Object.values(FIELDS);

/** The facts a form asks for, per kind. A film sits on a substrate too; a stack is described by its layers. */
export const PROPERTY_FIELDS: Record<SampleKind, readonly PropertyField[]> = {
  crystal: [FIELDS.supplier, FIELDS.supplierLot, FIELDS.growthMethod],
  chip: [FIELDS.substrate, FIELDS.oxideThicknessNm, FIELDS.chipWidthMm, FIELDS.chipHeightMm],
  flake: [FIELDS.positionXUm, FIELDS.positionYUm, FIELDS.flakeSizeUm],
  film: [FIELDS.substrate],
  stack: [],
  device: [FIELDS.deviceType],
  precursor: [FIELDS.supplier, FIELDS.supplierLot],
};

export function propertyField(name: string): PropertyField | undefined {
  return ALL_PROPERTY_FIELDS.find((field) => field.name === name);
}

export function fieldLabelWithUnit(field: { label: string; unit?: string }): string {
  return field.unit ? `${field.label} (${field.unit})` : field.label;
}

function isSubstrate(value: unknown): value is Substrate {
  return SUBSTRATES.some((substrate) => substrate === value);
}

/** "285 nm", "Si with SiO2", or the value as written; `withUnit: false` where the label has the unit. */
export function formatPropertyValue(field: PropertyField | undefined, value: unknown, withUnit = true): string {
  if (value === null || value === undefined || value === '') return '—';
  if (field?.control === 'substrate' && isSubstrate(value)) return SUBSTRATE_LABELS[value];
  const text = typeof value === 'number' ? value.toLocaleString() : typeof value === 'string' ? value : JSON.stringify(value);
  return field?.unit && withUnit ? `${text} ${field.unit}` : text;
}
