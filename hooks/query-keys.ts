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
} as const;
