import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { ShareLinkCreated, ShareLinkEnvelope, ShareLinkList, type ShareLinkCreateInput } from '@/shared/schemas/share-link';
import { apiFetch } from './api-client';
import { auditKeys, sampleKeys, STALE_TIMES } from './query-keys';

const linksPath = (code: string) => `/api/samples/${encodeURIComponent(code)}/share-links`;

/** A record's share links with their status and openings (managers only; the server decides). */
export function useShareLinksQuery(code: string, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: auditKeys.shareLinks(code),
    queryFn: async ({ signal }) => (await apiFetch(linksPath(code), { schema: ShareLinkList, signal })).shareLinks,
    enabled: code.length > 0 && (options.enabled ?? true),
    staleTime: STALE_TIMES.audit,
  });
}

/** Issues a link; the answer holds the only copy of its address the lab will ever see. */
export function useCreateShareLinkMutation(code: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: z.output<typeof ShareLinkCreateInput>) =>
      apiFetch(linksPath(code), { method: 'POST', body: input, schema: ShareLinkCreated }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: auditKeys.shareLinks(code) });
      void queryClient.invalidateQueries({ queryKey: sampleKeys.history(code) });
    },
  });
}

export function useRevokeShareLinkMutation(code: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (id: number) =>
      (await apiFetch(`/api/share-links/${id}/revoke`, { method: 'POST', schema: ShareLinkEnvelope })).shareLink,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: auditKeys.shareLinks(code) });
      void queryClient.invalidateQueries({ queryKey: sampleKeys.history(code) });
    },
  });
}
