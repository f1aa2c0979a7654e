/** The kinds of physical thing Flakeline keeps a record of, with their code prefixes. */
export const SAMPLE_KINDS = ['crystal', 'chip', 'flake', 'film', 'stack', 'device', 'precursor'] as const;
export type SampleKind = (typeof SAMPLE_KINDS)[number];

export const SAMPLE_KIND_LABELS: Record<SampleKind, string> = {
  crystal: 'Source crystal',
  chip: 'Substrate chip',
  flake: 'Flake',
  film: 'CVD film',
  stack: 'Stack',
  device: 'Device',
  precursor: 'Precursor lot',
};

export const SAMPLE_CODE_PREFIXES: Record<SampleKind, string> = {
  crystal: 'CR',
  chip: 'CH',
  flake: 'FK',
  film: 'FM',
  stack: 'SK',
  device: 'DV',
  precursor: 'PR',
};

/** Prefix of the codes on sample boxes (their own QR labels). */
export const BOX_CODE_PREFIX = 'BX';

/**
 * Where a sample is in its life. ready: on the shelf, usable; in_process: being worked on now;
 * used_up: consumed by a step; missing: cannot be found; discarded: thrown away on purpose;
 * retired: withdrawn by a lab manager with a reason (records are never deleted).
 */
export const SAMPLE_STATUSES = ['ready', 'in_process', 'used_up', 'missing', 'discarded', 'retired'] as const;
export type SampleStatus = (typeof SAMPLE_STATUSES)[number];

export const SAMPLE_STATUS_LABELS: Record<SampleStatus, string> = {
  ready: 'Ready',
  in_process: 'In process',
  used_up: 'Used up',
  missing: 'Missing',
  discarded: 'Discarded',
  retired: 'Retired',
};

/** Statuses a researcher may set by editing; `retired` only comes through retirement. */
export const EDITABLE_STATUSES = ['ready', 'in_process', 'used_up', 'missing', 'discarded'] as const;

/** Materials offered first in forms; any other name may be typed. */
export const COMMON_MATERIALS = [
  'graphene',
  'graphite',
  'hBN',
  'MoS2',
  'WS2',
  'WSe2',
  'MoSe2',
  'MoTe2',
  'Si/SiO2',
  'sapphire',
  'quartz',
] as const;
