/** The three roles of a Flakeline lab, from most to least privileged. */
export const ROLES = ['manager', 'researcher', 'reviewer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  manager: 'Lab manager',
  researcher: 'Researcher',
  reviewer: 'Reviewer',
};

export const ROLE_SUMMARIES: Record<Role, string> = {
  manager: 'Everything, including people, storage, labels, exports and retiring records.',
  researcher: 'Creates and edits records, logs runs and uploads evidence.',
  reviewer: 'Reads everything and exports audit reports; changes nothing.',
};

/** Roles that may change lab records (everything except read-only review). */
export const WRITER_ROLES: readonly Role[] = ['manager', 'researcher'];
