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
} as const;
