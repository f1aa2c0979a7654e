import { keepPreviousData, useInfiniteQuery, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SampleKind, SampleStatus } from '@/shared/samples';
import { HistoryList } from '@/shared/schemas/history';
import { Lineage } from '@/shared/schemas/lineage';
import {
  SampleEnvelope,
  SampleListPage,
  type RetireSampleInput,
  type Sample,
  type SampleCreateInput,
  type SampleListRow,
  type SampleUpdateInput,
} from '@/shared/schemas/sample';
import { ApiError, apiFetch, isApiError } from './api-client';
import { sampleKeys, STALE_TIMES, stepKeys } from './query-keys';

export type SampleSort = 'createdAt' | 'code' | 'updatedAt' | 'material' | 'kind' | 'status';
export type SortOrder = 'asc' | 'desc';

/** What the sample list is narrowed to; empty lists and strings mean "any". */
export interface SampleListFilters {
  kind: readonly SampleKind[];
  status: readonly SampleStatus[];
  material: string;
  ownerId: number | null;
  /** Bounds on the combined layer call from thickness evidence; null leaves that side open. */
  layersMin: number | null;
  layersMax: number | null;
  q: string;
  sort: SampleSort;
  order: SortOrder;
}

export const DEFAULT_SAMPLE_FILTERS: SampleListFilters = {
  kind: [],
  status: [],
  material: '',
  ownerId: null,
  layersMin: null,
  layersMax: null,
  q: '',
  sort: 'createdAt',
  order: 'desc',
};

/** One screenful on a phone, a comfortable table on a desk (common practice, no source). */
const LIST_PAGE_SIZE = 50;
/** The sample picker of a step shows a few best matches, not a whole list. */
const SEARCH_PAGE_SIZE = 8;
/** Fewer characters than this match most of the lab (every code starts with a two-letter prefix). */
export const SEARCH_MIN_LENGTH = 2;

function listPath(filters: SampleListFilters, page: number, pageSize: number): string {
  const query = new URLSearchParams();
  if (filters.kind.length) query.set('kind', filters.kind.join(','));
  if (filters.status.length) query.set('status', filters.status.join(','));
  if (filters.material.trim()) query.set('material', filters.material.trim());
  if (filters.ownerId !== null) query.set('ownerId', String(filters.ownerId));
  if (filters.layersMin !== null) query.set('layersMin', String(filters.layersMin));
  if (filters.layersMax !== null) query.set('layersMax', String(filters.layersMax));
  if (filters.q.trim()) query.set('q', filters.q.trim());
  query.set('sort', filters.sort);
  query.set('order', filters.order);
  query.set('page', String(page));
  query.set('pageSize', String(pageSize));
  return `/api/samples?${query.toString()}`;
}

const samplePath = (code: string) => `/api/samples/${encodeURIComponent(code)}`;

export interface SampleListResult {
  samples: SampleListRow[];
  total: number;
}

/** The filtered, sorted list, a page at a time ("Load more" asks for the next page). */
export function useSampleListQuery(filters: SampleListFilters) {
  return useInfiniteQuery({
    queryKey: sampleKeys.list(filters),
    queryFn: ({ pageParam, signal }) =>
      apiFetch(listPath(filters, pageParam, LIST_PAGE_SIZE), { schema: SampleListPage, signal }),
    initialPageParam: 1,
    getNextPageParam: (last) => (last.page * last.pageSize < last.total ? last.page + 1 : undefined),
    select: (data): SampleListResult => ({
      samples: data.pages.flatMap((page) => page.samples),
      total: data.pages[data.pages.length - 1]?.total ?? 0,
    }),
    // Changing a filter keeps the old rows on screen until the new ones arrive, instead of a spinner.
    placeholderData: keepPreviousData,
    staleTime: STALE_TIMES.samples,
  });
}

/** Best matches for a code or name typed into a sample picker. */
export function useSampleSearchQuery(text: string) {
  const q = text.trim();
  return useQuery({
    queryKey: sampleKeys.search(q),
    queryFn: async ({ signal }) =>
      (
        await apiFetch(listPath({ ...DEFAULT_SAMPLE_FILTERS, q, sort: 'updatedAt' }, 1, SEARCH_PAGE_SIZE), {
          schema: SampleListPage,
          signal,
        })
      ).samples,
    enabled: q.length >= SEARCH_MIN_LENGTH,
    placeholderData: keepPreviousData,
    staleTime: STALE_TIMES.samples,
  });
}

export function useSampleQuery(code: string, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: sampleKeys.detail(code),
    queryFn: async ({ signal }) => (await apiFetch(samplePath(code), { schema: SampleEnvelope, signal })).sample,
    enabled: code.length > 0 && (options.enabled ?? true),
    staleTime: STALE_TIMES.samples,
  });
}

export function useSampleLineageQuery(code: string, direction: 'ancestors' | 'descendants') {
  return useQuery({
    queryKey: sampleKeys.lineage(code, direction),
    queryFn: ({ signal }) => apiFetch(`${samplePath(code)}/${direction}`, { schema: Lineage, signal }),
    staleTime: STALE_TIMES.samples,
  });
}

/** Everything that happened to a sample, newest first (the server sends oldest first). */
export function useSampleHistoryQuery(code: string) {
  return useQuery({
    queryKey: sampleKeys.history(code),
    queryFn: async ({ signal }) => (await apiFetch(`${samplePath(code)}/history`, { schema: HistoryList, signal })).events,
    select: (events) => [...events].reverse(),
    staleTime: STALE_TIMES.samples,
  });
}

/**
 * An edit refused because the record changed meanwhile, with the record as it is now so the
 * person can compare and re-apply.
 */
export class StaleSampleError extends ApiError {
  readonly current: Sample;

  constructor(error: ApiError, current: Sample) {
    super(error.status, error.code, error.message, error.fields);
    this.current = current;
  }
}

export function isStaleSampleError(error: unknown): error is StaleSampleError {
  return error instanceof StaleSampleError;
}

/**
 * The API client keeps only the error envelope, not the `current` record a 409 carries, so the
 * record is read again here; a moment later it is at least as new as the one in the 409.
 */
async function withCurrentOnStale<T>(code: string, request: () => Promise<T>): Promise<T> {
  try {
    return await request();
  } catch (error) {
    if (!isApiError(error, 'stale_version')) throw error;
    const { sample } = await apiFetch(samplePath(code), { schema: SampleEnvelope });
    throw new StaleSampleError(error, sample);
  }
}

export function useCreateSampleMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: z.output<typeof SampleCreateInput>) =>
      (await apiFetch('/api/samples', { method: 'POST', body: input, schema: SampleEnvelope })).sample,
    onSuccess: (sample) => {
      queryClient.setQueryData(sampleKeys.detail(sample.code), sample);
      void queryClient.invalidateQueries({ queryKey: sampleKeys.lists() });
    },
  });
}

/** Also refreshes lineage and history: a status shows up in relatives' lists and every edit is an event. */
function afterSampleChange(queryClient: ReturnType<typeof useQueryClient>, sample: Sample) {
  queryClient.setQueryData(sampleKeys.detail(sample.code), sample);
  void queryClient.invalidateQueries({ queryKey: sampleKeys.all });
  void queryClient.invalidateQueries({ queryKey: stepKeys.all });
}

export function useUpdateSampleMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ code, changes }: { code: string; changes: z.output<typeof SampleUpdateInput> }) =>
      withCurrentOnStale(
        code,
        async () => (await apiFetch(samplePath(code), { method: 'PATCH', body: changes, schema: SampleEnvelope })).sample,
      ),
    onSuccess: (sample) => afterSampleChange(queryClient, sample),
    onError: (error) => {
      if (isStaleSampleError(error)) queryClient.setQueryData(sampleKeys.detail(error.current.code), error.current);
    },
  });
}

export function useRetireSampleMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ code, input }: { code: string; input: z.output<typeof RetireSampleInput> }) =>
      withCurrentOnStale(
        code,
        async () =>
          (await apiFetch(`${samplePath(code)}/retirement`, { method: 'POST', body: input, schema: SampleEnvelope })).sample,
      ),
    onSuccess: (sample) => afterSampleChange(queryClient, sample),
    onError: (error) => {
      if (isStaleSampleError(error)) queryClient.setQueryData(sampleKeys.detail(error.current.code), error.current);
    },
  });
}
