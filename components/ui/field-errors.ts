import type { z } from 'zod';
import { ApiError } from '@/hooks/api-client';

/**
 * Messages keyed by dotted path (`parameters.peelCycles`, `outputs.0.material`), the same keys
 * the server's 422 `fields` use, so one form can show both in the same places.
 */
export type PathErrors = Record<string, string[]>;

export function pathKey(path: readonly PropertyKey[]): string {
  return path.map(String).join('.');
}

export function errorsFromIssues(issues: readonly z.core.$ZodIssue[]): PathErrors {
  const errors: PathErrors = {};
  for (const issue of issues) {
    const key = pathKey(issue.path);
    errors[key] = [...(errors[key] ?? []), issue.message];
  }
  return errors;
}

/** The field messages of a failed request; empty for anything else. */
export function errorsFromRequest(error: unknown): PathErrors {
  return error instanceof ApiError ? error.fields : {};
}

/**
 * Splits messages into those a form shows beside one of its fields and the rest, which belong in
 * the banner above the submit button (an empty key is the form as a whole).
 */
export function partitionErrors(errors: PathErrors, shown: (key: string) => boolean): { placed: PathErrors; rest: string[] } {
  const placed: PathErrors = {};
  const rest: string[] = [];
  for (const [key, messages] of Object.entries(errors)) {
    if (key && shown(key)) placed[key] = messages;
    else rest.push(...messages);
  }
  return { placed, rest };
}
