import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  BoxEnvelope,
  BoxList,
  SampleLocationEnvelope,
  StoragePlace,
  StoragePlaceList,
  type BoxCreateInput,
  type StoragePlaceCreateInput,
} from '@/shared/schemas/storage';
import { apiFetch } from './api-client';
import { sampleKeys, STALE_TIMES, storageKeys } from './query-keys';

const boxPath = (code: string) => `/api/boxes/${encodeURIComponent(code)}`;
const locationPath = (code: string) => `/api/samples/${encodeURIComponent(code)}/location`;

/** Rooms, cabinets, desiccators… sorted by their path ("Lab 2.14 › Desiccator B"). */
export function usePlacesQuery() {
  return useQuery({
    queryKey: storageKeys.places(),
    queryFn: async ({ signal }) => (await apiFetch('/api/places', { schema: StoragePlaceList, signal })).places,
    staleTime: STALE_TIMES.storage,
  });
}

/** Every box with its place and how many of its slots hold a sample. */
export function useBoxesQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: storageKeys.boxes(),
    queryFn: async ({ signal }) => (await apiFetch('/api/boxes', { schema: BoxList, signal })).boxes,
    enabled: options.enabled ?? true,
    staleTime: STALE_TIMES.storage,
  });
}

/** One box with every slot in reading order. Codes are read forgivingly by the server. */
export function useBoxQuery(code: string, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: storageKeys.box(code),
    queryFn: async ({ signal }) => (await apiFetch(boxPath(code), { schema: BoxEnvelope, signal })).box,
    enabled: code.length > 0 && (options.enabled ?? true),
    staleTime: STALE_TIMES.storage,
  });
}

export function useCreatePlaceMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: StoragePlaceCreateInput) =>
      (
        await apiFetch('/api/places', {
          method: 'POST',
          body: input,
          schema: z.object({ place: StoragePlace }),
        })
      ).place,
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: storageKeys.all }),
  });
}

export function useCreateBoxMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: BoxCreateInput) =>
      (await apiFetch('/api/boxes', { method: 'POST', body: input, schema: BoxEnvelope })).box,
    onSuccess: (box) => {
      queryClient.setQueryData(storageKeys.box(box.code), box);
      void queryClient.invalidateQueries({ queryKey: storageKeys.all });
    },
  });
}

/**
 * A move changes the boxes on both ends, the sample's location and its history. Sample details
 * may be cached under a code as typed (lower case, say), so every cached detail is refreshed.
 */
function afterMove(queryClient: QueryClient) {
  void queryClient.invalidateQueries({ queryKey: storageKeys.all });
  void queryClient.invalidateQueries({ queryKey: [...sampleKeys.all, 'detail'] });
  void queryClient.invalidateQueries({ queryKey: [...sampleKeys.all, 'history'] });
}

export interface MoveSampleVariables {
  code: string;
  boxCode: string;
  slot: string;
}

/** Puts a sample into a slot (or moves it there). A taken slot fails with `slot_taken`. */
export function useMoveSampleMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ code, boxCode, slot }: MoveSampleVariables) =>
      apiFetch(locationPath(code), { method: 'PUT', body: { boxCode, slot }, schema: SampleLocationEnvelope }),
    onSuccess: () => afterMove(queryClient),
  });
}

/** Takes a sample out of its box, e.g. onto the bench or into an instrument. */
export function useTakeOutSampleMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (code: string) => apiFetch(locationPath(code), { method: 'DELETE', schema: SampleLocationEnvelope }),
    onSuccess: () => afterMove(queryClient),
  });
}
