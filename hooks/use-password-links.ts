import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import {
  Accepted,
  InvitationPreview,
  SignInResult,
  type AcceptInvitationInput,
  type ForgotPasswordInput,
  type ResetPasswordInput,
} from '@/shared/schemas/auth';
import { LinkTokenField } from '@/shared/schemas/fields';
import { apiFetch } from './api-client';
import { linkKeys, STALE_TIMES } from './query-keys';
import { startSession } from './use-session';

/** Whether a `?token=` from an e-mailed link has the right shape to be worth asking the server about. */
export function isWellFormedLinkToken(token: string | undefined): token is string {
  return LinkTokenField.safeParse(token).success;
}

/** Who an invitation is for, shown before the person chooses a password. */
export function useInvitationPreviewQuery(token: string | undefined, options: { enabled?: boolean } = {}) {
  const wellFormed = isWellFormedLinkToken(token);
  return useQuery({
    queryKey: linkKeys.invitation(token ?? ''),
    queryFn: ({ signal }) =>
      apiFetch(`/api/auth/invitations/${encodeURIComponent(token ?? '')}`, { schema: InvitationPreview, signal }),
    enabled: wellFormed && (options.enabled ?? true),
    staleTime: STALE_TIMES.invitationPreview,
  });
}

/** Accepting signs the new person in, with a fresh session and CSRF token. */
export function useAcceptInvitationMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof AcceptInvitationInput>) =>
      apiFetch('/api/auth/invitations/accept', { method: 'POST', body: input, schema: SignInResult }),
    onSuccess: (result) => startSession(queryClient, result),
  });
}

export function useForgotPasswordMutation() {
  return useMutation({
    mutationFn: (input: z.output<typeof ForgotPasswordInput>) =>
      apiFetch('/api/auth/password-reset-requests', { method: 'POST', body: input, schema: Accepted }),
  });
}

export function useResetPasswordMutation() {
  return useMutation({
    mutationFn: (input: z.output<typeof ResetPasswordInput>) =>
      apiFetch('/api/auth/password-resets', { method: 'POST', body: input, schema: Accepted }),
  });
}
