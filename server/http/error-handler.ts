import type { ErrorRequestHandler, RequestHandler } from 'express';
import { CheckViolationError, ForeignKeyViolationError, NotNullViolationError, UniqueViolationError } from 'objection';
import {
  AppError,
  StaleVersionError,
  conflict,
  csrfInvalid,
  databaseUnavailable,
  invalid,
  malformedJson,
  notFound,
  payloadTooLarge,
} from '../errors';

interface HttpishError {
  type?: string;
  status?: number;
  code?: string;
}

const CONNECTION_ERROR_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', '57P01', '57P03', '08006', '08001']);

function isDatabaseDown(error: unknown): boolean {
  const code = (error as HttpishError | undefined)?.code;
  if (code && CONNECTION_ERROR_CODES.has(code)) return true;
  const name = (error as Error | undefined)?.name;
  return name === 'KnexTimeoutError';
}

/** Maps anything thrown into an AppError; unknown errors stay unknown (a plain 500). */
export function toAppError(error: unknown): AppError | null {
  if (error instanceof AppError) return error;
  const httpish = (error ?? {}) as HttpishError;
  if (httpish.type === 'entity.parse.failed') return malformedJson();
  if (httpish.type === 'entity.too.large') return payloadTooLarge('The request body is larger than the API accepts.');
  if (httpish.code === 'EBADCSRFTOKEN') return csrfInvalid();
  if (isDatabaseDown(error)) return databaseUnavailable();
  const code = httpish.code ?? (error as { nativeError?: HttpishError } | undefined)?.nativeError?.code;
  // Two transactions waited on each other and PostgreSQL cancelled one: nothing was saved.
  if (code === '40P01' || code === '40001') {
    return conflict('conflict', 'Someone changed the same records at the same moment. Nothing was saved; try again.');
  }
  // Text PostgreSQL cannot store (e.g. a NUL character).
  if (code === '22P05' || code === '22021') return invalid({ _: ['The text contains a character that cannot be stored.'] });
  // Rules the database enforces as well as the code: report which one, not a stack trace.
  if (error instanceof UniqueViolationError) {
    return conflict('conflict', `A record with the same ${error.columns.join(', ')} already exists.`);
  }
  if (error instanceof ForeignKeyViolationError) {
    return conflict('conflict', 'This refers to a record that does not exist or is still referred to.');
  }
  if (error instanceof CheckViolationError) {
    return invalid({ _: [`The value breaks the rule "${error.constraint}".`] });
  }
  if (error instanceof NotNullViolationError) return invalid({ [error.column]: ['This field is required.'] });
  return null;
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(notFound(`There is no API endpoint ${req.method} ${req.originalUrl.split('?')[0]}.`));
};

export function errorHandler(log: (message: string, error: unknown) => void): ErrorRequestHandler {
  return (error, req, res, _next) => {
    const known = toAppError(error);
    if (!known) log(`Unhandled error on ${req.method} ${req.originalUrl}`, error);
    const status = known?.status ?? 500;
    const body = known
      ? {
          error: { code: known.code, message: known.message, ...(known.fields ? { fields: known.fields } : {}) },
          ...(known instanceof StaleVersionError ? { current: known.current } : {}),
        }
      : { error: { code: 'internal', message: 'Something went wrong on the server. It has been logged.' } };
    if (res.headersSent) return;
    res.status(status).json(body);
  };
}
