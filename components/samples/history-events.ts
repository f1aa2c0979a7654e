import { z } from 'zod';
import { SAMPLE_KIND_LABELS, SAMPLE_KINDS, SAMPLE_STATUS_LABELS, SAMPLE_STATUSES } from '@/shared/samples';
import type { HistoryEvent } from '@/shared/schemas/history';
import { STEP_TYPE_LABELS, STEP_TYPES } from '@/shared/steps';
import type { IconName } from '@/components/ui/button';
import { fieldLabelWithUnit, formatPropertyValue, propertyField } from './property-fields';

export interface DescribedEvent {
  icon: IconName;
  title: string;
  /** One line per change or detail, e.g. "name: ‘old’ → ‘new’". */
  lines: string[];
}

const StepTypeField = z.enum(STEP_TYPES);
const StatusField = z.enum(SAMPLE_STATUSES);

const CreatedPayload = z.object({ kind: z.enum(SAMPLE_KINDS), material: z.string() });
const EditedPayload = z.object({ changes: z.record(z.string(), z.object({ from: z.unknown(), to: z.unknown() })) });
const StatusPayload = z.object({ from: StatusField, to: StatusField });
const RetiredPayload = z.object({ reason: z.string() });
const UsedPayload = z.object({
  stepType: StepTypeField,
  consumed: z.boolean().optional(),
  outputs: z.array(z.string()).optional(),
});
const StepTypePayload = z.object({ stepType: StepTypeField, parents: z.array(z.string()).optional() });

const FIELD_NAMES: Record<string, string> = { material: 'material', name: 'name', note: 'note', ownerId: 'owner (person id)' };

function quoted(value: unknown): string {
  if (value === null || value === undefined || value === '') return '(none)';
  if (typeof value === 'string') return `‘${value}’`;
  if (typeof value === 'number' || typeof value === 'boolean') return `‘${String(value)}’`;
  return `‘${JSON.stringify(value)}’`;
}

function record(value: unknown): Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Record<string, unknown>) : {};
}

/** Properties are one field on the server; people think of them one by one. */
function propertyLines(from: unknown, to: unknown): string[] {
  const before = record(from);
  const after = record(to);
  const names = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  return names
    .filter((name) => JSON.stringify(before[name]) !== JSON.stringify(after[name]))
    .map((name) => {
      const field = propertyField(name);
      const label = field ? fieldLabelWithUnit(field).toLowerCase() : name;
      const show = (value: unknown) => (value === undefined ? '(none)' : `‘${formatPropertyValue(field, value, false)}’`);
      return `${label}: ${show(before[name])} → ${show(after[name])}`;
    });
}

function statusLabel(value: unknown): unknown {
  const status = StatusField.safeParse(value);
  return status.success ? SAMPLE_STATUS_LABELS[status.data] : value;
}

/** "name: ‘old’ → ‘new’" for each changed field. */
export function changeLines(changes: Record<string, { from?: unknown; to?: unknown }>): string[] {
  return Object.entries(changes).flatMap(([field, change]) => {
    if (field === 'properties') return propertyLines(change.from, change.to);
    if (field === 'status') return [`status: ${quoted(statusLabel(change.from))} → ${quoted(statusLabel(change.to))}`];
    return [`${FIELD_NAMES[field] ?? field}: ${quoted(change.from)} → ${quoted(change.to)}`];
  });
}

/** A step type's label inside a sentence: "exfoliation", but "CVD growth" keeps its capitals. */
export function stepTypePhrase(type: string): string {
  const known = StepTypeField.safeParse(type);
  const label = known.success ? STEP_TYPE_LABELS[known.data] : type;
  return /^[A-Z][a-z]/.test(label) ? label.charAt(0).toLowerCase() + label.slice(1) : label;
}

const stepLabel = (type: z.infer<typeof StepTypeField>) => stepTypePhrase(type);

const EVIDENCE_KIND_WORDS: Record<string, string> = {
  micrograph: 'micrograph',
  raman: 'Raman spectrum',
  pl: 'PL spectrum',
  afm: 'AFM profile',
};
const text = (value: unknown) => (typeof value === 'string' || typeof value === 'number' ? String(value) : null);

/** Events whose sentence needs at most a line or two from the payload. */
const PLAIN_EVENTS: Partial<
  Record<string, { icon: IconName; title: string; lines?: (payload: Record<string, unknown>) => string[] }>
> = {
  'sample.moved': { icon: 'move-outline', title: 'Moved' },
  'evidence.added': {
    icon: 'document-attach-outline',
    title: 'Thickness evidence added',
    lines: (p) => [EVIDENCE_KIND_WORDS[String(p.kind)] ?? 'file', text(p.originalName)].filter((line): line is string => !!line),
  },
  'evidence.edited': { icon: 'create-outline', title: 'Evidence details edited' },
  'evidence.analysed': { icon: 'analytics-outline', title: 'Evidence analysed' },
  'lens_design.saved': {
    icon: 'aperture-outline',
    title: 'Lens design saved',
    lines: (p) => (text(p.zoneCount) ? [`${text(p.zoneCount)} zones`] : []),
  },
  'measurement.added': { icon: 'stats-chart-outline', title: 'Measurement added' },
  'measurement.deleted': { icon: 'trash-outline', title: 'Measurement removed' },
  'share_link.created': { icon: 'share-social-outline', title: 'Audit share link issued' },
  'share_link.revoked': { icon: 'close-circle-outline', title: 'Audit share link withdrawn' },
  'share_link.opened': {
    icon: 'eye-outline',
    title: 'Audit opened through a share link',
    lines: (p) => (text(p.format) ? [`As ${text(p.format)}`] : []),
  },
};

/**
 * A sentence for one event of a sample's history, read from its payload. `madeByType` is the type
 * of the step that made the sample (its creation event names only the step's id).
 */
export function describeEvent(event: HistoryEvent, madeByType?: string): DescribedEvent {
  const { payload } = event;
  switch (event.type) {
    case 'sample.created': {
      const created = CreatedPayload.safeParse(payload);
      const what = created.success ? `${SAMPLE_KIND_LABELS[created.data.kind]}, ${created.data.material}` : 'sample';
      const maker = StepTypeField.safeParse(madeByType);
      return event.stepId
        ? {
            icon: 'sparkles-outline',
            title: maker.success ? `Made by ${stepLabel(maker.data)}` : 'Made by a logged step',
            lines: [what],
          }
        : { icon: 'add-circle-outline', title: 'Registered', lines: [what] };
    }
    case 'sample.edited': {
      const edited = EditedPayload.safeParse(payload);
      return { icon: 'create-outline', title: 'Edited', lines: edited.success ? changeLines(edited.data.changes) : [] };
    }
    case 'sample.status_changed': {
      const status = StatusPayload.safeParse(payload);
      return {
        icon: 'swap-horizontal-outline',
        title: status.success
          ? `Status: ${SAMPLE_STATUS_LABELS[status.data.from]} → ${SAMPLE_STATUS_LABELS[status.data.to]}`
          : 'Status changed',
        lines: event.stepId ? ['Set by the step it was used in'] : [],
      };
    }
    case 'sample.retired': {
      const retired = RetiredPayload.safeParse(payload);
      return { icon: 'archive-outline', title: 'Retired', lines: retired.success ? [`Reason: ${retired.data.reason}`] : [] };
    }
    case 'sample.used': {
      const used = UsedPayload.safeParse(payload);
      if (!used.success) return { icon: 'git-branch-outline', title: 'Used in a step', lines: [] };
      const lines = [
        ...(used.data.consumed ? ['Used up by this step'] : []),
        ...(used.data.outputs?.length ? [`Made ${used.data.outputs.join(', ')}`] : []),
      ];
      return { icon: 'git-branch-outline', title: `Used in ${stepLabel(used.data.stepType)}`, lines };
    }
    case 'sample.treated': {
      const treated = StepTypePayload.safeParse(payload);
      return {
        icon: 'flame-outline',
        title: treated.success ? `Treated by ${stepLabel(treated.data.stepType)}` : 'Treated in a step',
        lines: [],
      };
    }
    case 'sample.linked': {
      const linked = StepTypePayload.safeParse(payload);
      return {
        icon: 'link-outline',
        title: linked.success ? `Linked as made by ${stepLabel(linked.data.stepType)}` : 'Linked to its parents',
        lines: linked.success && linked.data.parents?.length ? [`From ${linked.data.parents.join(', ')}`] : [],
      };
    }
    case 'step.logged':
      return { icon: 'git-merge-outline', title: 'Step logged', lines: [] };
    case 'samples.imported':
      return { icon: 'cloud-upload-outline', title: 'Imported', lines: [] };
    default: {
      const plain = PLAIN_EVENTS[event.type];
      return plain
        ? { icon: plain.icon, title: plain.title, lines: plain.lines?.(record(payload)) ?? [] }
        : { icon: 'ellipse-outline', title: event.type, lines: [] };
    }
  }
}
