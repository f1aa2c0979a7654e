import { z } from 'zod';

/** Stable error codes: clients branch on these, people read the message. */
export const ERROR_CODES = [
  'malformed_json',
  'payload_too_large',
  'unauthenticated',
  'invalid_credentials',
  'account_deactivated',
  'csrf_invalid',
  'forbidden',
  'not_found',
  'conflict',
  'email_taken',
  'last_manager',
  'link_invalid',
  'link_expired',
  'link_used',
  'validation_failed',
  'code_typo',
  'lineage_cycle',
  'stale_version',
  'sample_unavailable',
  'slot_taken',
  'idempotency_conflict',
  'too_many_attempts',
  'database_unavailable',
  'mail_unavailable',
  'not_a_device',
  'share_link_expired',
  'share_link_revoked',
  'file_type_mismatch',
  'image_too_large',
  'image_corrupt',
  'spectrum_invalid',
  'file_missing',
  'file_altered',
  'internal',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

export const ApiErrorBody = z
  .object({
    error: z.object({
      code: z.enum(ERROR_CODES),
      message: z.string(),
      fields: z.record(z.string(), z.array(z.string())).optional(),
    }),
    /** With stale_version: the record as it is now. */
    current: z.unknown().optional(),
  })
  .meta({ id: 'ApiError' });
export type ApiErrorBody = z.infer<typeof ApiErrorBody>;
