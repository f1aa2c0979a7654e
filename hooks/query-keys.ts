/** Every cache key the app uses; mutations invalidate through these, never by hand-written arrays. */
export const sessionKeys = {
  all: ['session'] as const,
  current: () => [...sessionKeys.all, 'current'] as const,
};

export const userKeys = {
  all: ['users'] as const,
  list: () => [...userKeys.all, 'list'] as const,
};

export const mailKeys = {
  all: ['mail'] as const,
  outbox: () => [...mailKeys.all, 'outbox'] as const,
};

export interface SampleListKeyFilters {
  kind: readonly string[];
  status: readonly string[];
  material: string;
  ownerId: number | null;
  layersMin: number | null;
  layersMax: number | null;
  q: string;
  sort: string;
  order: 'asc' | 'desc';
}

export const sampleKeys = {
  all: ['samples'] as const,
  lists: () => [...sampleKeys.all, 'list'] as const,
  list: (filters: SampleListKeyFilters) => [...sampleKeys.lists(), filters] as const,
  search: (text: string) => [...sampleKeys.all, 'search', text] as const,
  detail: (code: string) => [...sampleKeys.all, 'detail', code] as const,
  lineage: (code: string, direction: 'ancestors' | 'descendants') => [...sampleKeys.all, direction, code] as const,
  history: (code: string) => [...sampleKeys.all, 'history', code] as const,
  /** Chips no one has searched for flakes yet (the bench's to-do list). */
  awaitingSearch: () => [...sampleKeys.all, 'awaiting-search'] as const,
  /** Samples of one kind matching typed text, e.g. precursor lots for a growth run. */
  kindSearch: (kind: string, text: string) => [...sampleKeys.all, 'kind-search', kind, text] as const,
};

export const stepKeys = {
  all: ['steps'] as const,
  detail: (id: number) => [...stepKeys.all, 'detail', id] as const,
  /** The signed-in person's own recent steps, optionally of one type. */
  mine: (type: string | null, limit: number) => [...stepKeys.all, 'mine', type ?? 'any', limit] as const,
  templates: () => [...stepKeys.all, 'templates'] as const,
};

export const storageKeys = {
  all: ['storage'] as const,
  places: () => [...storageKeys.all, 'places'] as const,
  boxes: () => [...storageKeys.all, 'boxes'] as const,
  box: (code: string) => [...storageKeys.all, 'box', code] as const,
};

export const labelKeys = {
  all: ['labels'] as const,
  templates: () => [...labelKeys.all, 'templates'] as const,
  /** The codes of a filtered sample list, gathered for a sheet of labels. */
  resultCodes: (filters: SampleListKeyFilters, limit: number) => [...labelKeys.all, 'result-codes', filters, limit] as const,
};

export const linkKeys = {
  all: ['links'] as const,
  invitation: (token: string) => [...linkKeys.all, 'invitation', token] as const,
};

export const evidenceKeys = {
  all: ['evidence'] as const,
  /** A sample's evidence list and its combined layer call. */
  ofSample: (code: string) => [...evidenceKeys.all, 'sample', code] as const,
  detail: (id: number) => [...evidenceKeys.all, 'detail', id] as const,
  /** The text of a stored spectrum or profile, which never changes (it is named by its checksum). */
  fileText: (sha256: string) => [...evidenceKeys.all, 'file-text', sha256] as const,
};

export const calibrationKeys = {
  all: ['calibrations'] as const,
  list: (includeRetired: boolean) => [...calibrationKeys.all, 'list', includeRetired] as const,
};

export const deviceKeys = {
  all: ['devices'] as const,
  lensDesign: (code: string) => [...deviceKeys.all, 'lens-design', code] as const,
  measurements: (code: string) => [...deviceKeys.all, 'measurements', code] as const,
};

export const labSettingsKeys = {
  all: ['lab-settings'] as const,
  current: () => [...labSettingsKeys.all, 'current'] as const,
};

export const lineageGraphKeys = {
  all: ['lineage-graph'] as const,
  detail: (code: string) => [...lineageGraphKeys.all, code] as const,
};

export const auditKeys = {
  all: ['audits'] as const,
  report: (code: string) => [...auditKeys.all, 'report', code] as const,
  /** An audit opened through a share link, signed out. */
  shared: (token: string) => [...auditKeys.all, 'shared', token] as const,
  shareLinks: (code: string) => [...auditKeys.all, 'share-links', code] as const,
};

/**
 * How long each kind of answer counts as fresh, in milliseconds. The session rarely changes
 * under us; the people list changes when a colleague acts; the outbox is for watching mail arrive.
 * The numbers are judgement (common practice, no source).
 */
export const STALE_TIMES = {
  session: 5 * 60_000,
  users: 30_000,
  outbox: 5_000,
  invitationPreview: 60_000,
  /** Colleagues register and use samples all day; a short window keeps the bench view current. */
  samples: 15_000,
  /** A logged step never changes; its samples' statuses may, so it is refetched now and then. */
  step: 60_000,
  /** Boxes fill and empty as people put samples away; as fresh as the sample list. */
  storage: 15_000,
  /** Label sheets are set up once and rarely change. */
  labelTemplates: 5 * 60_000,
  /** Saved step templates change only when their owner saves one. */
  stepTemplates: 60_000,
  /** Evidence changes when someone uploads or marks regions; as fresh as the sample it belongs to. */
  evidence: 15_000,
  /** Calibrations are measured once per microscope and objective and rarely replaced. */
  calibrations: 5 * 60_000,
  /** A lens design or a measurement changes when someone on the device's project saves one. */
  devices: 15_000,
  /** Managers change the lab's settings rarely. */
  labSettings: 5 * 60_000,
  /** An audit re-hashes every file and the history chain: worth keeping a minute. */
  audit: 60_000,
} as const;
