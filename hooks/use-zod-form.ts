import { useCallback, useState } from 'react';
import type { z } from 'zod';
import { ApiError } from './api-client';

export type FieldErrors<K extends string> = Partial<Record<K, string[]>>;

export interface ZodForm<S extends z.ZodType, K extends string> {
  values: Record<K, string>;
  setValue: (name: K, value: string) => void;
  reset: (values?: Partial<Record<K, string>>) => void;
  /** Messages per field, from the schema or the server's 422 `fields`. */
  errors: FieldErrors<K>;
  /** Messages that belong to no single field (e.g. a cross-field rule). */
  formErrors: string[];
  /** Checks the values (plus `extra`, e.g. a link token) and hands the parsed input on, or shows what is wrong. */
  submit: (onValid: (input: z.output<S>) => void, extra?: Record<string, unknown>) => void;
  /** Shows a failed request's field messages inline. True when at least one landed on a field here. */
  showServerErrors: (error: unknown) => boolean;
}

/**
 * Form state validated by the same shared zod schema the server uses, so people see the same
 * wording before and after a round trip.
 */
export function useZodForm<S extends z.ZodType, K extends string>(schema: S, initial: Record<K, string>): ZodForm<S, K> {
  // The first values given are the form's blank state; later renders pass fresh objects.
  const [blank] = useState(initial);
  const [values, setValues] = useState(initial);
  const [errors, setErrors] = useState<FieldErrors<K>>({});
  const [formErrors, setFormErrors] = useState<string[]>([]);

  const isField = useCallback((name: PropertyKey): name is K => typeof name === 'string' && name in blank, [blank]);

  const setValue = useCallback((name: K, value: string) => {
    setValues((current) => ({ ...current, [name]: value }));
    // Editing a field answers its complaint; keep the others until the next submit.
    setErrors((current) => (current[name] ? { ...current, [name]: undefined } : current));
  }, []);

  const reset = useCallback(
    (next: Partial<Record<K, string>> = {}) => {
      setValues({ ...blank, ...next });
      setErrors({});
      setFormErrors([]);
    },
    [blank],
  );

  const submit = useCallback(
    (onValid: (input: z.output<S>) => void, extra: Record<string, unknown> = {}) => {
      const result = schema.safeParse({ ...values, ...extra });
      if (result.success) {
        setErrors({});
        setFormErrors([]);
        onValid(result.data);
        return;
      }
      const nextErrors: FieldErrors<K> = {};
      const nextFormErrors: string[] = [];
      for (const issue of result.error.issues) {
        const name = issue.path[0];
        if (name !== undefined && isField(name)) {
          nextErrors[name] = [...(nextErrors[name] ?? []), issue.message];
        } else {
          nextFormErrors.push(issue.message);
        }
      }
      setErrors(nextErrors);
      setFormErrors(nextFormErrors);
    },
    [schema, values, isField],
  );

  const showServerErrors = useCallback(
    (error: unknown) => {
      if (!(error instanceof ApiError)) return false;
      const nextErrors: FieldErrors<K> = {};
      let placed = false;
      for (const [name, messages] of Object.entries(error.fields)) {
        if (isField(name) && messages.length > 0) {
          nextErrors[name] = messages;
          placed = true;
        }
      }
      setErrors(nextErrors);
      return placed;
    },
    [isField],
  );

  return { values, setValue, reset, errors, formErrors, submit, showServerErrors };
}
