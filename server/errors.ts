import type { ErrorCode } from '../shared/schemas/errors';

export type FieldErrors = Record<string, string[]>;

/** An error the API reports to the client as `{"error":{"code","message","fields"?}}`. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const malformedJson = (message = 'The request body is not valid JSON.') => new AppError(400, 'malformed_json', message);
export const unauthenticated = (message = 'Sign in to continue.') => new AppError(401, 'unauthenticated', message);
export const invalidCredentials = () =>
  new AppError(401, 'invalid_credentials', 'That e-mail and password do not match an account.');
export const accountDeactivated = () =>
  new AppError(403, 'account_deactivated', 'This account has been deactivated. Ask your lab manager.');
export const forbidden = (message = 'Your role does not allow this.') => new AppError(403, 'forbidden', message);
export const csrfInvalid = () =>
  new AppError(403, 'csrf_invalid', 'The form expired or came from elsewhere. Reload and try again.');
export const notFound = (message: string) => new AppError(404, 'not_found', message);
export const conflict = (
  code: 'conflict' | 'email_taken' | 'last_manager' | 'slot_taken' | 'idempotency_conflict',
  message: string,
) => new AppError(409, code, message);
export const linkInvalid = () => new AppError(404, 'link_invalid', 'This link is not valid. Check that it was copied whole.');
export const linkExpired = () => new AppError(410, 'link_expired', 'This link has expired. Ask for a new one.');
export const linkUsed = () => new AppError(410, 'link_used', 'This link has already been used. Ask for a new one.');
export const payloadTooLarge = (message = 'The request is too large.') => new AppError(413, 'payload_too_large', message);
export const invalid = (fields: FieldErrors, message = 'Some fields need attention.') =>
  new AppError(422, 'validation_failed', message, fields);
export const codeTypo = (message: string) => new AppError(422, 'code_typo', message);
export const lineageCycle = (message: string, fields?: FieldErrors) => new AppError(422, 'lineage_cycle', message, fields);
/** A stale edit: carries the current record so the screen can show what changed meanwhile. */
export class StaleVersionError extends AppError {
  constructor(
    message: string,
    readonly current: unknown,
  ) {
    super(409, 'stale_version', message);
  }
}
export const sampleUnavailable = (message: string, fields?: FieldErrors) =>
  new AppError(409, 'sample_unavailable', message, fields);
export const tooManyAttempts = (message: string) => new AppError(429, 'too_many_attempts', message);
export const databaseUnavailable = () =>
  new AppError(503, 'database_unavailable', 'The database is not answering. Try again in a moment.');
export const mailUnavailable = () =>
  new AppError(503, 'mail_unavailable', 'The mail server did not accept the message. Nothing was saved; try again.');
export const notADevice = (message: string) => new AppError(422, 'not_a_device', message);
export const shareLinkExpired = () =>
  new AppError(410, 'share_link_expired', 'This shared audit link has expired. Ask the lab that sent it for a new one.');
export const shareLinkRevoked = () =>
  new AppError(410, 'share_link_revoked', 'This shared audit link was withdrawn by the lab that sent it.');
export const fileTypeMismatch = (message: string) => new AppError(415, 'file_type_mismatch', message);
export const imageTooLarge = (message: string) => new AppError(413, 'image_too_large', message);
export const imageCorrupt = (message: string) => new AppError(422, 'image_corrupt', message);
export const spectrumInvalid = (message: string, fields?: FieldErrors) => new AppError(422, 'spectrum_invalid', message, fields);
/** A stored file the database names but the file store no longer has. */
export const fileMissing = (sha256: string) =>
  new AppError(409, 'file_missing', `The stored file ${sha256.slice(0, 12)}… is missing from the file store. Nothing was sent.`);
/** A stored file whose bytes no longer hash to its name: never served. */
export const fileAltered = (sha256: string) =>
  new AppError(
    409,
    'file_altered',
    `The stored file ${sha256.slice(0, 12)}… no longer matches its SHA-256 checksum, so it is not served.`,
  );
