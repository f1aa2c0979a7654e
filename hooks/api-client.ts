import { z } from 'zod';
import { CsrfToken } from '@/shared/schemas/auth';
import { ApiErrorBody, type ErrorCode } from '@/shared/schemas/errors';

/** Codes the client invents for failures that never produced a server answer it could read. */
export type ClientErrorCode = 'network_unreachable' | 'unexpected_response';
export type ApiErrorCode = ErrorCode | ClientErrorCode;
export type FieldMessages = Record<string, string[]>;

export class ApiError extends Error {
  override readonly name = 'ApiError';
  /** HTTP status, or 0 when the server could not be reached at all. */
  readonly status: number;
  readonly code: ApiErrorCode;
  readonly fields: FieldMessages;

  constructor(status: number, code: ApiErrorCode, message: string, fields: FieldMessages = {}) {
    super(message);
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

const NETWORK_MESSAGE = 'Cannot reach the Flakeline server. Check your connection to the lab network and try again.';

/** Used only when the server's own message is missing; its messages are written for people. */
const FALLBACK_MESSAGES: Record<ApiErrorCode, string> = {
  malformed_json: 'The app sent a request the server could not read. Reload the page and try again.',
  payload_too_large: 'That is more than the server accepts in one go.',
  unauthenticated: 'You are signed out. Sign in again to carry on.',
  invalid_credentials: 'That e-mail and password do not match an account.',
  account_deactivated: 'This account has been deactivated. Ask your lab manager to reactivate it.',
  csrf_invalid: 'Your session’s security check expired. Reload the page and try again.',
  forbidden: 'Your role does not allow this.',
  not_found: 'That could not be found. It may have been removed.',
  conflict: 'Someone changed this at the same time. Reload and try again.',
  email_taken: 'Someone in the lab already uses that e-mail address.',
  last_manager: 'The lab needs at least one active lab manager.',
  link_invalid: 'This link is not valid. Check that it was copied completely.',
  link_expired: 'This link has expired.',
  link_used: 'This link has already been used.',
  validation_failed: 'Some fields need attention.',
  code_typo: 'That code has a typing mistake in it: its check symbol does not match. Read it off the label again.',
  lineage_cycle: 'That would make a sample its own ancestor.',
  stale_version: 'Someone changed this record after you opened it. Look at their change, then try again.',
  sample_unavailable: 'That sample cannot be used right now; it may be retired or used up.',
  slot_taken: 'That slot already holds a sample. Choose a free slot.',
  idempotency_conflict: 'This submission was already sent with different details. Start a new entry instead of resending.',
  too_many_attempts: 'Too many attempts. Wait a few minutes and try again.',
  database_unavailable: 'The Flakeline database is not available right now. Try again in a minute.',
  mail_unavailable: 'The mail server could not be reached, so no e-mail was sent.',
  not_a_device: 'Only a device record can carry a lens design or device measurements.',
  share_link_expired: 'This shared audit link has expired. Ask the lab for a new one.',
  share_link_revoked: 'This shared audit link was withdrawn by the lab.',
  file_type_mismatch:
    'That file is not what its name or the chosen kind says. Micrographs are JPEG, PNG or TIFF; spectra and profiles are text.',
  image_too_large: 'That image has more pixels than Flakeline accepts. Save a smaller or cropped copy and try again.',
  image_corrupt: 'That image could not be read; it may be damaged or cut short. Export it again and retry.',
  spectrum_invalid: 'That file is not a two-column spectrum or profile Flakeline can read.',
  file_missing: 'The stored file is missing from the lab’s file store. Tell your lab manager.',
  file_altered: 'The stored file no longer matches its checksum, so it is not shown. Tell your lab manager.',
  internal: 'The Flakeline server ran into a problem. Try again; if it keeps happening, tell your lab manager.',
  network_unreachable: NETWORK_MESSAGE,
  unexpected_response:
    'The Flakeline server answered in a way this app does not understand. Reload the page; if it keeps happening, the app and server may be out of step.',
};

/** Turns anything thrown into a sentence a person can act on. */
export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    return error.message.trim() || FALLBACK_MESSAGES[error.code];
  }
  return 'Something went wrong in the app. Reload the page and try again.';
}

export function isApiError(error: unknown, ...codes: ApiErrorCode[]): error is ApiError {
  return error instanceof ApiError && (codes.length === 0 || codes.includes(error.code));
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface ApiRequest {
  method?: Method;
  body?: unknown;
  signal?: AbortSignal;
  /** Extra request headers, e.g. `Idempotency-Key` on a step that may be sent again. */
  headers?: Readonly<Record<string, string>>;
}

let csrfToken: string | null = null;
let csrfRequest: Promise<string> | null = null;
/** Bumped whenever the token is replaced, so a slow fetch cannot overwrite a newer one. */
let csrfGeneration = 0;

/** Sign-in and invitation-accept start a new session with a new token; switch to it. */
export function rememberCsrfToken(token: string): void {
  csrfGeneration += 1;
  csrfToken = token;
}

export function forgetCsrfToken(): void {
  csrfGeneration += 1;
  csrfToken = null;
}

/** The session's CSRF token, fetched once; also used by the upload helper, which sends multipart bodies. */
export async function loadCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  if (!csrfRequest) {
    const generation = csrfGeneration;
    csrfRequest = send('/api/auth/csrf', 'GET', undefined, undefined, undefined, undefined)
      .then((response) => readBody(response, CsrfToken))
      .then(({ csrfToken: token }) => {
        if (generation === csrfGeneration) csrfToken = token;
        return csrfToken ?? token;
      })
      .finally(() => {
        csrfRequest = null;
      });
  }
  return csrfRequest;
}

async function send(
  path: string,
  method: Method,
  body: unknown,
  token: string | undefined,
  signal: AbortSignal | undefined,
  extraHeaders: Readonly<Record<string, string>> | undefined,
): Promise<Response> {
  const headers: Record<string, string> = { ...extraHeaders, Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (token) headers['x-csrf-token'] = token;
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
      signal,
    });
  } catch (cause) {
    // A cancelled query is not a network failure; let React Query see the abort.
    if (signal?.aborted) throw cause;
    throw new ApiError(0, 'network_unreachable', NETWORK_MESSAGE);
  }
  if (!response.ok) throw await readError(response);
  return response;
}

async function readJson(response: Response): Promise<unknown> {
  try {
    return await response.json();
  } catch {
    return undefined;
  }
}

/** The error envelope of a failed answer as an `ApiError` (also used by the upload helper). */
export async function readError(response: Response): Promise<ApiError> {
  const parsed = ApiErrorBody.safeParse(await readJson(response));
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(response.status, code, message, fields);
  }
  // No envelope: a proxy, a crashed server or a route the server does not know.
  const status = response.status;
  if (status === 502 || status === 503 || status === 504) {
    return new ApiError(status, 'network_unreachable', NETWORK_MESSAGE);
  }
  if (status === 404) return new ApiError(status, 'not_found', '');
  if (status === 413) return new ApiError(status, 'payload_too_large', '');
  if (status === 429) return new ApiError(status, 'too_many_attempts', '');
  return new ApiError(status, 'internal', '');
}

async function readBody<S extends z.ZodType>(response: Response, schema: S): Promise<z.output<S>> {
  const parsed = schema.safeParse(await readJson(response));
  if (!parsed.success) throw new ApiError(response.status, 'unexpected_response', '');
  return parsed.data;
}

/**
 * The one way the app talks to the API: same-origin cookies, the CSRF header on every change
 * (refreshed and retried once if the server rejects it), errors as `ApiError`, and the answer
 * checked against the shared zod schema when one is given.
 */
export function apiFetch<S extends z.ZodType>(path: string, options: ApiRequest & { schema: S }): Promise<z.output<S>>;
export function apiFetch(path: string, options?: ApiRequest): Promise<void>;
export async function apiFetch(path: string, options: ApiRequest & { schema?: z.ZodType } = {}): Promise<unknown> {
  const { method = 'GET', body, signal, schema, headers } = options;
  const mutating = method !== 'GET';

  let response: Response;
  try {
    response = await send(path, method, body, mutating ? await loadCsrfToken() : undefined, signal, headers);
  } catch (error) {
    if (!(mutating && isApiError(error, 'csrf_invalid'))) throw error;
    forgetCsrfToken();
    response = await send(path, method, body, await loadCsrfToken(), signal, headers);
  }

  if (!schema) return undefined;
  return readBody(response, schema);
}
