import { describeError, isApiError } from '@/hooks/api-client';
import { Notice } from './notice';

export interface FormProblemProps {
  /** The failed request, if any. */
  error?: unknown;
  /** Schema messages that belong to no single field. */
  formErrors?: readonly string[];
  /** Heading of the banner, e.g. "Could not sign in". */
  title: string;
}

/** One banner above a form's submit button for whatever stopped it, in plain words. */
export function FormProblem({ error, formErrors = [], title }: FormProblemProps) {
  if (!error && formErrors.length === 0) return null;
  return (
    <Notice tone={isApiError(error, 'network_unreachable') ? 'warn' : 'error'} title={title} testID="form-problem">
      {error ? describeError(error) : null}
      {formErrors}
    </Notice>
  );
}
