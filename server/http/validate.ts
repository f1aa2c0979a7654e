import type { Request } from 'express';
import type { z } from 'zod';
import { invalid, malformedJson, type FieldErrors } from '../errors';

function fieldErrors(error: z.ZodError, prefix?: string): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || '_';
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

function parsePart(schema: z.ZodType | undefined, value: unknown, prefix?: string): unknown {
  if (!schema) return undefined;
  const result = schema.safeParse(value);
  if (!result.success) throw invalid(fieldErrors(result.error, prefix));
  return result.data;
}

/** Validates body, query and path parameters of a request against a route's zod schemas. */
export function parseInput(
  spec: { body?: z.ZodType; query?: z.ZodType; params?: z.ZodType },
  req: Request,
): { body: never; query: never; params: never } {
  if (spec.body && (req.body === undefined || req.body === null) && req.method !== 'GET') {
    throw malformedJson('Send a JSON body with Content-Type: application/json.');
  }
  return {
    params: parsePart(spec.params, req.params, 'params') as never,
    query: parsePart(spec.query, req.query, 'query') as never,
    body: parsePart(spec.body, req.body) as never,
  };
}
