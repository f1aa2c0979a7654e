import { useQuery } from '@tanstack/react-query';
import { LineageGraph } from '@/shared/schemas/lineage-graph';
import { apiFetch } from './api-client';
import { lineageGraphKeys, STALE_TIMES } from './query-keys';

/** Every ancestor and descendant of a record with the steps linking them, for the lineage picture. */
export function useLineageGraphQuery(code: string) {
  return useQuery({
    queryKey: lineageGraphKeys.detail(code),
    queryFn: ({ signal }) => apiFetch(`/api/samples/${encodeURIComponent(code)}/lineage-graph`, { schema: LineageGraph, signal }),
    enabled: code.length > 0,
    staleTime: STALE_TIMES.samples,
  });
}
