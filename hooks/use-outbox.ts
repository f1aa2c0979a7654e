import { useQuery } from '@tanstack/react-query';
import { CapturedMailList } from '@/shared/schemas/mail';
import { apiFetch } from './api-client';
import { mailKeys, STALE_TIMES } from './query-keys';

function newestFirst(outbox: CapturedMailList): CapturedMailList {
  return {
    enabled: outbox.enabled,
    messages: [...outbox.messages].sort((a, b) => b.receivedAt.localeCompare(a.receivedAt)),
  };
}

/** Messages caught by the lab's local mail sink, newest first. */
export function useOutboxQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: mailKeys.outbox(),
    queryFn: ({ signal }) => apiFetch('/api/mail-sink/messages', { schema: CapturedMailList, signal }),
    select: newestFirst,
    staleTime: STALE_TIMES.outbox,
    enabled: options.enabled ?? true,
  });
}
