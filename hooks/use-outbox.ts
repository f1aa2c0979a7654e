import { useQuery } from '@tanstack/react-query';
import { CapturedMailList } from '@/shared/schemas/mail';
import { apiFetch } from './api-client';
import { mailKeys, STALE_TIMES } from './query-keys';

/** Messages caught by the lab's local mail sink, newest first. */
export function useOutboxQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: mailKeys.outbox(),
    queryFn: ({ signal }) => apiFetch('/api/mail-sink/messages', { schema: CapturedMailList, signal }),
    select: (outbox) => ({
      enabled: outbox.enabled,
      messages: [...outbox.messages].sort((a, b) => b.receivedAt.localeCompare(a.receivedAt)),
    }),
    staleTime: STALE_TIMES.outbox,
    enabled: options.enabled ?? true,
  });
}
