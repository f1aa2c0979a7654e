import { useQueryClient } from '@tanstack/react-query';
import { useCallback } from 'react';
import { SampleEnvelope, type Sample } from '@/shared/schemas/sample';
import { BoxEnvelope, type Box } from '@/shared/schemas/storage';
import { apiFetch } from './api-client';
import { sampleKeys, STALE_TIMES, storageKeys } from './query-keys';

/** A record named by a scanned or typed code (already checked and written canonically). */
export type RecordRef = { kind: 'sample'; code: string } | { kind: 'box'; code: string };

export type FoundRecord = { kind: 'sample'; sample: Sample } | { kind: 'box'; box: Box };

/**
 * Looks a scanned record up before going to it, so "not found" can be said on the scan screen
 * (and scanning goes on) instead of on an empty record page. The answer lands in the same cache
 * entry the record's screen reads, so that screen opens without a second request.
 */
export function useRecordLookup(): (ref: RecordRef) => Promise<FoundRecord> {
  const queryClient = useQueryClient();
  return useCallback(
    async (ref: RecordRef) => {
      if (ref.kind === 'sample') {
        const sample = await queryClient.fetchQuery({
          queryKey: sampleKeys.detail(ref.code),
          queryFn: async ({ signal }) =>
            (await apiFetch(`/api/samples/${encodeURIComponent(ref.code)}`, { schema: SampleEnvelope, signal })).sample,
          staleTime: STALE_TIMES.samples,
        });
        return { kind: 'sample', sample };
      }
      const box = await queryClient.fetchQuery({
        queryKey: storageKeys.box(ref.code),
        queryFn: async ({ signal }) =>
          (await apiFetch(`/api/boxes/${encodeURIComponent(ref.code)}`, { schema: BoxEnvelope, signal })).box,
        staleTime: STALE_TIMES.storage,
      });
      return { kind: 'box', box };
    },
    [queryClient],
  );
}
